/**
 * express-session store over Drizzle: sessions live in the `sessions` table so any instance of
 * the server can answer any request.
 */
import { eq, lt } from 'drizzle-orm';
import session from 'express-session';
import { sessions } from '../../drizzle/schema';
import type { Db } from '../db';

const DAY_MS = 24 * 60 * 60 * 1000;

type Callback = (err?: unknown) => void;

export class DrizzleSessionStore extends session.Store {
  private readonly pruneTimer: NodeJS.Timeout;

  constructor(private readonly db: Db, pruneEveryMs = 60 * 60 * 1000) {
    super();
    this.pruneTimer = setInterval(() => void this.prune().catch(() => undefined), pruneEveryMs);
    this.pruneTimer.unref();
  }

  override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
    this.db.select().from(sessions).where(eq(sessions.sid, sid)).then(([row]) => {
      if (!row || row.expires.getTime() <= Date.now()) return callback(null, null);
      callback(null, row.data as session.SessionData);
    }, callback);
  }

  override set(sid: string, data: session.SessionData, callback?: Callback): void {
    const expires = expiryOf(data);
    this.db.insert(sessions).values({ sid, data, expires })
      .onConflictDoUpdate({ target: sessions.sid, set: { data, expires } })
      .then(() => callback?.(), (err) => callback?.(err));
  }

  override destroy(sid: string, callback?: Callback): void {
    this.db.delete(sessions).where(eq(sessions.sid, sid)).then(() => callback?.(), (err) => callback?.(err));
  }

  override touch(sid: string, data: session.SessionData, callback?: Callback): void {
    this.db.update(sessions).set({ expires: expiryOf(data) }).where(eq(sessions.sid, sid))
      .then(() => callback?.(), (err) => callback?.(err));
  }

  /** Deletes expired sessions. */
  async prune(): Promise<void> {
    await this.db.delete(sessions).where(lt(sessions.expires, new Date()));
  }

  stop(): void {
    clearInterval(this.pruneTimer);
  }
}

function expiryOf(data: session.SessionData): Date {
  const cookieExpires = data.cookie?.expires;
  return cookieExpires ? new Date(cookieExpires) : new Date(Date.now() + DAY_MS);
}
