/**
 * CSRF protection (signed double-submit cookie, csrf-csrf): every POST, PUT, PATCH and DELETE
 * under /api must send the token from GET /api/csrf in header x-csrf-token, equal to the
 * `runnel.csrf` cookie and carrying an HMAC under the session secret. A signed-in caller's token is
 * bound to the session id; a signed-out visitor's is bound to no session, so asking for a token
 * stores nothing (no session row for every visitor). Signing in or out makes a new session, so
 * the client fetches a new token.
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
    // Signed out: '' (the session would not be saved, and its id changes every request).
    getSessionIdentifier: (req) => (req.user ? req.session.id : ''),
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
      res.json({ token: generateCsrfToken(req, res) });
    },
  };
}
