/**
 * express-rate-limit store over Drizzle: attempt counters live in the `rate_limits` table, so every
 * server instance behind a load balancer sees the same count, and a restart does not reset it.
 */
import { eq, lt, sql } from 'drizzle-orm';
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import { rateLimits } from '../../drizzle/schema';
import type { Db } from '../db';

const PRUNE_EVERY = 200;

export class DrizzleRateLimitStore implements Store {
  private windowMs = 60_000;
  private increments = 0;

  constructor(
    private readonly db: Db,
    readonly prefix = 'signin:',
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const [row] = await this.db
      .select()
      .from(rateLimits)
      .where(eq(rateLimits.key, this.prefix + key));
    if (!row || row.resetAt.getTime() <= Date.now()) return undefined;
    return { totalHits: row.hits, resetTime: row.resetAt };
  }

  /** One atomic upsert: a window that has ended starts again at 1. */
  async increment(key: string): Promise<ClientRateLimitInfo> {
    const resetAt = new Date(Date.now() + this.windowMs);
    const [row] = await this.db
      .insert(rateLimits)
      .values({ key: this.prefix + key, hits: 1, resetAt })
      .onConflictDoUpdate({
        target: rateLimits.key,
        set: {
          hits: sql`case when ${rateLimits.resetAt} <= now() then 1 else ${rateLimits.hits} + 1 end`,
          resetAt: sql`case when ${rateLimits.resetAt} <= now() then excluded.reset_at else ${rateLimits.resetAt} end`,
        },
      })
      .returning({ hits: rateLimits.hits, resetAt: rateLimits.resetAt });
    if (++this.increments % PRUNE_EVERY === 0) await this.prune();
    return { totalHits: row.hits, resetTime: row.resetAt };
  }

  async decrement(key: string): Promise<void> {
    await this.db
      .update(rateLimits)
      .set({ hits: sql`greatest(${rateLimits.hits} - 1, 0)` })
      .where(eq(rateLimits.key, this.prefix + key));
  }

  async resetKey(key: string): Promise<void> {
    await this.db.delete(rateLimits).where(eq(rateLimits.key, this.prefix + key));
  }

  /** Deletes counters whose window has ended. */
  async prune(): Promise<void> {
    await this.db.delete(rateLimits).where(lt(rateLimits.resetAt, new Date()));
  }
}
