/**
 * CSRF protection (double-submit cookie bound to the session id, csrf-csrf): every POST, PUT,
 * PATCH and DELETE under /api must send the token from GET /api/csrf in header x-csrf-token.
 */
import type { RequestHandler } from 'express';
import { doubleCsrf } from 'csrf-csrf';
import { ApiError } from '../errors';

export const CSRF_HEADER = 'x-csrf-token';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export interface Csrf {
  /** Rejects unsafe methods without a valid token (403, code 'csrf'). */
  protect: RequestHandler;
  /** GET /api/csrf */
  issue: RequestHandler;
}

export function createCsrf(secret: string, secure: boolean): Csrf {
  const { generateCsrfToken, validateRequest } = doubleCsrf({
    getSecret: () => secret,
    getSessionIdentifier: (req) => req.session.id,
    cookieName: 'runnel.csrf',
    cookieOptions: { sameSite: 'lax', secure, httpOnly: true, path: '/' },
    getCsrfTokenFromRequest: (req) => req.headers[CSRF_HEADER],
  });
  return {
    protect(req, _res, next) {
      if (SAFE_METHODS.has(req.method) || validateRequest(req)) return next();
      next(new ApiError('csrf', `Missing or invalid CSRF token: fetch GET /api/csrf and send it in header ${CSRF_HEADER}`));
    },
    issue(req, res) {
      // Marking the session makes express-session save it, so its id (which the token is bound to) persists.
      req.session.csrf = true;
      res.json({ token: generateCsrfToken(req, res) });
    },
  };
}
