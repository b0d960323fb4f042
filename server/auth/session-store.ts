/**
 * express-session store over Drizzle: sessions live in the `sessions` table so any instance of
 * the server can answer any request. A signed-in request moves its session's expiry at most once
 * a minute (not a row write per request), and expired rows are purged at start and every hour.
 */
import { and, eq, lt } from 'drizzle-orm';
import session from 'express-session';
import { sessions } from '../../drizzle/schema';
import type { Db } from '../db';

const DAY_MS = 24 * 60 * 60 * 1000;
/** A touch that would move the stored expiry by less than this is skipped. */
export const TOUCH_EVERY_MS = 60 * 1000;
/** Stored expiries remembered between get() and touch() of one request; beyond this the oldest go. */
const MAX_REMEMBERED = 10_000;

type Callback = (err?: unknown) => void;

export class DrizzleSessionStore extends session.Store {
  private readonly pruneTimer: NodeJS.Timeout;
  private readonly firstPrune: NodeJS.Timeout;
  /** sid → expiry as stored, read by get(); touch() of the same request compares against it. */
  private readonly storedExpiry = new Map<string, number>();

  constructor(
    private readonly db: Db,
    pruneEveryMs = 60 * 60 * 1000,
  ) {
    super();
    const prune = () => void this.prune().catch(() => undefined);
    this.pruneTimer = setInterval(prune, pruneEveryMs);
    this.pruneTimer.unref();
    // Soon after start too: a server restarted more often than hourly still purges.
    this.firstPrune = setTimeout(prune, Math.min(pruneEveryMs, 10_000));
    this.firstPrune.unref();
  }

  override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
    this.db
      .select()
      .from(sessions)
      .where(eq(sessions.sid, sid))
      .then(([row]) => {
        if (!row || row.expires.getTime() <= Date.now()) return callback(null, null);
        this.remember(sid, row.expires.getTime());
        callback(null, row.data as session.SessionData);
      }, callback);
  }

  override set(sid: string, data: session.SessionData, callback?: Callback): void {
    this.storedExpiry.delete(sid);
    const expires = expiryOf(data);
    this.db
      .insert(sessions)
      .values({ sid, data, expires })
      .onConflictDoUpdate({ target: sessions.sid, set: { data, expires } })
      .then(
        () => callback?.(),
        (err) => callback?.(err),
      );
  }

  override destroy(sid: string, callback?: Callback): void {
    this.storedExpiry.delete(sid);
    this.db
      .delete(sessions)
      .where(eq(sessions.sid, sid))
      .then(
        () => callback?.(),
        (err) => callback?.(err),
      );
  }

  /**
   * express-session calls this on every request that did not change the session. The expiry moves
   * only when that gains a minute or more: no query at all when get() saw a recent expiry, and a
   * conditional UPDATE (which writes nothing when another instance touched it) otherwise.
   */
  override touch(sid: string, data: session.SessionData, callback?: Callback): void {
    const expires = expiryOf(data);
    const stored = this.storedExpiry.get(sid);
    this.storedExpiry.delete(sid);
    if (stored !== undefined && expires.getTime() - stored < TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    const staleBefore = new Date(expires.getTime() - TOUCH_EVERY_MS);
    this.db
      .update(sessions)
      .set({ expires })
      .where(and(eq(sessions.sid, sid), lt(sessions.expires, staleBefore)))
      .then(
        () => callback?.(),
        (err) => callback?.(err),
      );
  }

  private remember(sid: string, expiresMs: number): void {
    // A request that fails before touch() leaves its entry; keep the map bounded.
    if (this.storedExpiry.size >= MAX_REMEMBERED) this.storedExpiry.delete(this.storedExpiry.keys().next().value!);
    this.storedExpiry.set(sid, expiresMs);
  }

  /** Deletes expired sessions. */
  async prune(): Promise<void> {
    await this.db.delete(sessions).where(lt(sessions.expires, new Date()));
  }

  stop(): void {
    clearInterval(this.pruneTimer);
    clearTimeout(this.firstPrune);
  }
}

function expiryOf(data: session.SessionData): Date {
  const cookieExpires = data.cookie?.expires;
  return cookieExpires ? new Date(cookieExpires) : new Date(Date.now() + DAY_MS);
}
