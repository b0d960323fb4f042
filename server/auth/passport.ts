/**
 * passport-local sign-in, the session's user, and the current team's membership on each request.
 */
import type { RequestHandler } from 'express';
import { eq } from 'drizzle-orm';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { users } from '../../drizzle/schema';
import type { Db } from '../db';
import type { SessionUser } from '../types';
import { checkPassword, dummyHash, type PasswordPool } from './passwords';
import { pickCurrentTeam, teamsOf } from './me';

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

/** A passport instance of our own (not the global singleton), so several apps can run in one process. */
export function createPassport(db: Db, bcryptCost: number, pool: PasswordPool): passport.Authenticator {
  const auth = new passport.Authenticator();
  auth.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      // A refused check (pool busy) must reach `done`, or the request would hang.
      (async () => {
        const [row] = await db
          .select()
          .from(users)
          .where(eq(users.email, normaliseEmail(email)));
        const ok = await checkPassword(password, row?.passwordHash ?? (await dummyHash(bcryptCost, pool)), pool);
        return row && ok ? { id: row.id, email: row.email, name: row.name } : false;
      })().then((user) => done(null, user), done);
    }),
  );
  auth.serializeUser<string>((user, done) => done(null, user.id));
  auth.deserializeUser<string>((id, done) => {
    db.select({ id: users.id, email: users.email, name: users.name })
      .from(users)
      .where(eq(users.id, id))
      .then(([row]) => done(null, row ?? false), done);
  });
  return auth;
}

/** Resolves req.membership from the session's current team (falls back to the user's first team). */
export function currentMember(db: Db): RequestHandler {
  return async (req, _res, next) => {
    const user: SessionUser | undefined = req.user;
    if (!user) return next();
    const current = pickCurrentTeam(await teamsOf(db, user.id), req.session.teamId);
    if (current) req.membership = { teamId: current.id, teamName: current.name, roles: current.roles };
    next();
  };
}
