/** /api/auth/*: sign-in (rate-limited), sign-out, me, switching team. */
import type { Request, RequestHandler } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type passport from 'passport';
import { z } from 'zod';
import { MIN_PASSWORD_LENGTH } from '../../shared/accounts';
import type { ApiRoutes } from '../api-routes';
import { buildMe, loadMe, teamsOf } from '../auth/me';
import { normaliseEmail } from '../auth/passport';
import { DrizzleRateLimitStore } from '../auth/rate-limit-store';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import type { SessionUser } from '../types';

export const PASSWORD_MIN = MIN_PASSWORD_LENGTH;
export const emailField = z.email('must be an e-mail address').max(254);
export const passwordField = z.string().min(PASSWORD_MIN, `must be at least ${PASSWORD_MIN} characters`).max(200);
export const nameField = z.string().trim().min(1, 'is required').max(120);

const signinBody = z.object({
  email: z.string({ error: 'must be a text' }).min(1, 'is required').max(254, 'must be at most 254 characters'),
  password: z.string({ error: 'must be a text' }).min(1, 'is required').max(200, 'must be at most 200 characters'),
});
const currentTeamBody = z.object({ teamId: z.uuid('must be a team id') });

export const SESSION_COOKIE = 'runnel.sid';

export interface SigninLimit {
  max: number;
  windowMs: number;
}

/** Signs `user` in (passport regenerates the session) and makes `teamId` current. */
export async function signIn(req: Request, user: SessionUser, teamId?: string): Promise<void> {
  await new Promise<void>((done, fail) => req.login(user, (err) => (err ? fail(err) : done())));
  if (teamId) req.session.teamId = teamId;
}

export function authRoutes(api: ApiRoutes, ctx: AppContext, auth: passport.Authenticator, limit: SigninLimit): void {
  const { db } = ctx;

  const signinLimiter = rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new DrizzleRateLimitStore(db),
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${normaliseEmail(String(req.body?.email ?? ''))}`,
    handler: (_req, res, _next, options) => {
      const minutes = Math.ceil(options.windowMs / 60000);
      res.status(429).json({ error: { code: 'rate-limited', message: `Too many sign-in attempts for this e-mail; try again in ${minutes} minutes.` } });
    },
  });

  // The body is checked before the limiter, whose key holds the e-mail (an object or a megabyte is a 400, not a key).
  const validSignin: RequestHandler = (req, _res, next) => {
    parseBody(signinBody, req.body);
    next();
  };

  api.post('/auth/signin', 'public', validSignin, signinLimiter, ctx.passwordBudget, (req, res, next) => {
    auth.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) return next(new ApiError('unauthenticated', 'E-mail or password is wrong'));
      signIn(req, user).then(async () => {
        const list = await teamsOf(db, user.id);
        const current = list[0] ?? null;
        req.session.teamId = current?.id;
        res.json(buildMe(user, list, current));
      }, next);
    })(req, res, next);
  });

  api.post('/auth/signout', 'public', (req, res, next) => {
    // logout() leaves a fresh, empty session that express-session would store; destroy it instead.
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        res.clearCookie(SESSION_COOKIE, { path: '/' });
        res.status(204).end();
      });
    });
  });

  api.get('/auth/me', 'signed-in', async (req, res) => {
    res.json(await loadMe(db, req.user!, req.session.teamId));
  });

  api.post('/auth/current-team', 'signed-in', async (req, res) => {
    const { teamId } = parseBody(currentTeamBody, req.body);
    const list = await teamsOf(db, req.user!.id);
    const chosen = list.find((t) => t.id === teamId);
    if (!chosen) throw new ApiError('not-found', 'No such team among yours');
    req.session.teamId = teamId;
    res.json(buildMe(req.user!, list, chosen));
  });
}
