/**
 * /api/auth/signup: creating an account without telling anyone whether an address is registered.
 * Both cases answer the same 202 after the same lookup, and both send one mail after the answer:
 * a new address gets a link that finishes the sign-up (server/auth/signup-token.ts), an existing
 * one a note to its owner. The password is chosen when the link is opened, not asked for here: a
 * link mailed to someone else's address must never carry a password its sender knows (pressing
 * the button would hand them the account). Limited per IP and per e-mail (no mail-bombing an address).
 * Without SMTP_HOST the mail lands in the capture sink: in development the link is also logged
 * (server/mail/dev-mail-log.ts); in production sign-up is closed (503) rather than mailing no one.
 */
import { eq } from 'drizzle-orm';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import { z } from 'zod';
import { memberships, teams, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import { loadMe } from '../auth/me';
import { normaliseEmail } from '../auth/passport';
import { hashPassword } from '../auth/passwords';
import { DrizzleRateLimitStore } from '../auth/rate-limit-store';
import { openSignup, sealSignup } from '../auth/signup-token';
import type { AppContext } from '../context';
import type { Db } from '../db';
import type { OutgoingMail } from '../mail/mailer';
import { ApiError, parseBody } from '../errors';
import { emailField, nameField, passwordField, signIn } from './auth';

const signupBody = z.object({ email: emailField, name: nameField, teamName: nameField });
const confirmBody = z.object({
  token: z.string({ error: 'must be a text' }).min(1, 'is required').max(2000, 'is not a valid link'),
  password: passwordField,
});

/** Sign-up requests allowed per window: per client IP, and per e-mail address. */
export interface SignupLimit {
  perIp: number;
  perEmail: number;
  windowMs: number;
}
export const DEFAULT_SIGNUP_LIMIT: SignupLimit = { perIp: 10, perEmail: 3, windowMs: 60 * 60 * 1000 };

const SIGNUP_CLOSED = 'Sign-up is closed on this server: it has no outgoing mail to send the confirmation link. Ask its operator for an invitation.';
export const SIGNUP_ANSWER = 'Check your e-mail: we sent a message to finish creating your account. It may take a few minutes.';

function limiter(
  db: Db,
  max: number,
  windowMs: number,
  prefix: string,
  key: (req: Parameters<typeof ipKeyGenerator>[0] & { ip?: string; body?: { email?: unknown } }) => string,
) {
  return rateLimit({
    windowMs,
    limit: max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new DrizzleRateLimitStore(db, prefix),
    keyGenerator: key as never,
    handler: (_req, res, _next, options) => {
      const minutes = Math.ceil(options.windowMs / 60000);
      res.status(429).json({ error: { code: 'rate-limited', message: `Too many sign-up requests; try again in ${minutes} minutes.` } });
    },
  });
}

/** Where the mailed link leads: the token rides in the fragment, which browsers never send to a server or a proxy's log. */
const confirmLink = (publicUrl: string, token: string) => `${publicUrl}/sign-up/confirm#${token}`;

function confirmationMail(ctx: AppContext, email: string, name: string, teamName: string): OutgoingMail {
  const token = sealSignup(ctx.config.sessionSecret, { email, name, teamName });
  return {
    to: email,
    subject: 'Finish creating your Runnel account',
    text:
      `Hello,\n\nTo choose your password and finish creating your Runnel account and your team, open this link within 24 hours:\n\n` +
      `${confirmLink(ctx.config.publicUrl, token)}\n\n` +
      `If you did not ask for an account, ignore this message: nothing is created until the link is opened.\n`,
  };
}

function ownerNote(ctx: AppContext, email: string, name: string): OutgoingMail {
  return {
    to: email,
    subject: 'Someone asked to create a Runnel account with your address',
    text:
      `Hello ${name},\n\nSomeone asked to create a new Runnel account for this address, but it already has one. ` +
      `If that was you, sign in instead:\n\n${ctx.config.publicUrl}/sign-in\n\nIf it was not you, ignore this message: nothing was changed.\n`,
  };
}

export function signupRoutes(api: ApiRoutes, ctx: AppContext, limit: SignupLimit): void {
  const { db } = ctx;
  const perIp = limiter(db, limit.perIp, limit.windowMs, 'signup-ip:', (req) => ipKeyGenerator(req.ip ?? ''));
  // The e-mail key needs a valid body first (an object or a megabyte is a 400, not a key).
  const perEmail = limiter(db, limit.perEmail, limit.windowMs, 'signup-email:', (req) => normaliseEmail(String(req.body?.email ?? '')));

  api.post(
    '/auth/signup',
    'public',
    (_req, _res, next) => {
      // In production without a mail server no one could read the link (the Outbox shows only a team's mail).
      if (ctx.config.production && !ctx.config.smtp) throw new ApiError('unavailable', SIGNUP_CLOSED);
      next();
    },
    perIp,
    (req, _res, next) => {
      parseBody(signupBody, req.body);
      next();
    },
    perEmail,
    async (req, res) => {
      const body = parseBody(signupBody, req.body);
      const email = normaliseEmail(body.email);
      const [existing] = await db.select({ name: users.name }).from(users).where(eq(users.email, email));
      res.status(202).json({ status: 'check-email', message: SIGNUP_ANSWER });
      const mail = existing ? ownerNote(ctx, email, existing.name) : confirmationMail(ctx, email, body.name, body.teamName);
      // After the answer in both cases: how long a mail server takes must not tell the two apart.
      ctx.mailer.send(mail).catch((err: unknown) => ctx.log(`sign-up mail failed: ${err instanceof Error ? err.message : String(err)}`));
    },
  );

  api.post('/auth/signup/confirm', 'public', ctx.passwordBudget, async (req, res) => {
    const { token, password } = parseBody(confirmBody, req.body);
    const pending = openSignup(ctx.config.sessionSecret, token);
    if (pending === null)
      throw new ApiError('validation', 'This sign-up link is not valid; copy the whole link from the e-mail', {
        fields: [{ path: 'token', message: 'is not a valid link' }],
      });
    if (pending === 'expired')
      throw new ApiError('validation', 'This sign-up link has expired; sign up again', { fields: [{ path: 'token', message: 'has expired' }] });
    const passwordHash = await hashPassword(password, ctx.bcryptCost, ctx.passwords);
    const created = await db.transaction(async (tx) => {
      // Used already, or two clicks at once: the insert finds the address taken (409), not a unique-key 500.
      const [user] = await tx
        .insert(users)
        .values({ email: pending.email, name: pending.name, passwordHash })
        .onConflictDoNothing({ target: users.email })
        .returning({ id: users.id, email: users.email, name: users.name });
      if (!user) throw new ApiError('conflict', 'This account already exists; sign in instead');
      const [team] = await tx.insert(teams).values({ name: pending.teamName }).returning({ id: teams.id });
      await tx.insert(memberships).values({ teamId: team.id, userId: user.id, roles: ['admin'] });
      await audit(tx, { teamId: team.id, user, action: 'team.create', target: pending.teamName });
      return { user, teamId: team.id };
    });
    // Signed in already (as someone else): the client asked first; regenerating the session replaces that sign-in.
    await signIn(req, created.user, created.teamId);
    res.status(201).json(await loadMe(db, created.user, created.teamId));
  });
}
