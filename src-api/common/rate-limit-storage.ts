import type { ThrottlerStorage } from '@nestjs/throttler';
import { sql } from 'drizzle-orm';
import type { Db } from '../db/client';

/** One in this many increments also clears windows that ended more than an hour ago. */
const SWEEP_EVERY = 200;

interface Row extends Record<string, unknown> {
  hits: number;
  ms_left: number;
}

/**
 * Rate-limit counters in PostgreSQL (the unlogged `rate_limit` table), so that every API process
 * behind a load balancer counts the same hits: a fixed window per key, started by its first hit
 * and counted by one upsert. A key over its limit stays blocked until its window ends.
 */
export class PgThrottlerStorage implements ThrottlerStorage {
  private sinceSweep = 0;

  constructor(private readonly db: Db) {}

  async increment(key: string, ttl: number, limit: number, _blockDuration: number, throttlerName: string): Promise<{ totalHits: number; timeToExpire: number; isBlocked: boolean; timeToBlockExpire: number }> {
    const id = `${throttlerName}:${key}`;
    const { rows } = await this.db.execute<Row>(sql`
      insert into rate_limit (key, hits, expires_at) values (${id}, 1, now() + ${ttl} * interval '1 millisecond')
      on conflict (key) do update set
        hits = case when rate_limit.expires_at <= now() then 1 else rate_limit.hits + 1 end,
        expires_at = case when rate_limit.expires_at <= now() then excluded.expires_at else rate_limit.expires_at end
      returning hits, greatest(0, extract(epoch from (expires_at - now())) * 1000)::float8 as ms_left`);
    if (++this.sinceSweep >= SWEEP_EVERY) {
      this.sinceSweep = 0;
      await this.db.execute(sql`delete from rate_limit where expires_at < now() - interval '1 hour'`);
    }
    const hits = Number(rows[0].hits);
    const secondsLeft = Math.ceil(Number(rows[0].ms_left) / 1000);
    const blocked = hits > limit;
    // A blocked key waits out its window. (Our throttlers leave blockDuration at its default, the
    // window's length, so a block ends when the window does.)
    return { totalHits: hits, timeToExpire: secondsLeft, isBlocked: blocked, timeToBlockExpire: blocked ? secondsLeft : 0 };
  }
}
