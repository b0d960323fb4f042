/** What route modules need from the running app. */
import type { Config } from './config';
import type { Db } from './db';
import type { Mailer } from './mail/mailer';

export interface AppContext {
  db: Db;
  config: Config;
  mailer: Mailer;
  /** bcrypt cost for new password hashes (10 in production; tests lower it). */
  bcryptCost: number;
  log(line: string): void;
}
