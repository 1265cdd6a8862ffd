import { eq, lt, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { rateLimitHit } from '../db/schema';

/** Rate-limit counters in the database, shared by every instance (fixed windows). */
export function createRateLimitRepository(db: Db) {
  return {
    /** Counts one hit on `key`: in its current window, or as the first of a new one of `windowMs` once it has ended. */
    async hit(key: string, windowMs: number): Promise<{ hits: number; resetAt: Date }> {
      const fresh = sql`now() + ${windowMs} * interval '1 millisecond'`;
      const ended = sql`${rateLimitHit.resetAt} <= now()`;
      // One statement: concurrent hits from several instances serialise on the row.
      const [row] = await db
        .insert(rateLimitHit)
        .values({ key, hits: 1, resetAt: fresh })
        .onConflictDoUpdate({
          target: rateLimitHit.key,
          set: { hits: sql`case when ${ended} then 1 else ${rateLimitHit.hits} + 1 end`, resetAt: sql`case when ${ended} then excluded.reset_at else ${rateLimitHit.resetAt} end` },
        })
        .returning({ hits: rateLimitHit.hits, resetAt: rateLimitHit.resetAt });
      return row;
    },
    /** Takes one hit back (a request the limiter is told not to count). */
    async unhit(key: string): Promise<void> {
      await db.update(rateLimitHit).set({ hits: sql`greatest(${rateLimitHit.hits} - 1, 0)` }).where(eq(rateLimitHit.key, key));
    },
    async reset(key: string): Promise<void> {
      await db.delete(rateLimitHit).where(eq(rateLimitHit.key, key));
    },
    /** Drops counters whose window ended before `before`. */
    async sweep(before: Date): Promise<void> {
      await db.delete(rateLimitHit).where(lt(rateLimitHit.resetAt, before));
    },
  };
}

export type RateLimitRepository = ReturnType<typeof createRateLimitRepository>;
