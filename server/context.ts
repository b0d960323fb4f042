/** What route modules need from the running app. */
import type { RequestHandler } from 'express';
import type { Config } from './config';
import type { Db } from './db';
import type { Mailer } from './mail/mailer';
import type { PasswordPool } from './auth/passwords';

export interface AppContext {
  db: Db;
  config: Config;
  mailer: Mailer;
  /** bcrypt cost for new password hashes (10 in production; tests lower it). */
  bcryptCost: number;
  /** Worker threads for bcrypt (server/auth/passwords.ts). */
  passwords: PasswordPool;
  /** The per-IP budget of password checks (server/auth/password-budget.ts); mount before a route that hashes or checks one. */
  passwordBudget: RequestHandler;
  log(line: string): void;
}
