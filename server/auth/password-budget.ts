/**
 * The per-IP budget of password checks (sign-in, sign-up, accepting an invitation with a new
 * password). The sign-in limiter counts failures per IP *and e-mail*, so random e-mails each got a
 * fresh allowance and one client could keep a core busy with bcrypt; this counts every check per IP,
 * in the shared `rate_limits` table so all instances see one budget. The global budget is the
 * password pool's queue (server/auth/passwords.ts).
 */
import type { RequestHandler } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type { Db } from '../db';
import { DrizzleRateLimitStore } from './rate-limit-store';

export interface PasswordBudget {
  max: number;
  windowMs: number;
}

/** 50 checks per IP per 15 minutes: far above a person, far below a flood. */
export const DEFAULT_PASSWORD_BUDGET: PasswordBudget = { max: 50, windowMs: 15 * 60 * 1000 };

export function passwordBudget(db: Db, budget: PasswordBudget): RequestHandler {
  return rateLimit({
    windowMs: budget.windowMs,
    limit: budget.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new DrizzleRateLimitStore(db, 'pwcheck:'),
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
    handler: (_req, res, _next, options) => {
      const minutes = Math.ceil(options.windowMs / 60000);
      res.status(429).json({ error: { code: 'rate-limited', message: `Too many password attempts from your network; try again in ${minutes} minutes.` } });
    },
  });
}
