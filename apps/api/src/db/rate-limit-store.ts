import type { RateLimitStore, RateWindow } from '../lib/rate-limiter';
import type { Database } from './write-lock';

/** How often (at most) a store deletes closed windows; their rows are dead weight, never wrong. */
const sweepEveryMs = 60_000;

/**
 * Rate-limit counters in the `rate_limit_counters` table, so every API process on the same
 * database counts against one allowance. Plain SQL that SQLite and PostgreSQL both accept; every
 * statement that writes runs through the write lock (one transaction each).
 */
export function databaseRateLimitStore(db: Database): RateLimitStore {
  let lastSweep = -Infinity;
  const toWindow = (row: { hits: number | string; window_end: number | string }): RateWindow => ({ hits: Number(row.hits), endsAt: Number(row.window_end) });

  return {
    async peek(bucket, key, now) {
      const rows = await db.reader.query<Array<{ hits: number; window_end: number }>>(
        `SELECT hits, window_end FROM rate_limit_counters WHERE bucket = ? AND key = ? AND window_end > ?`,
        [bucket, key, now],
      );
      return rows[0] ? toWindow(rows[0]) : null;
    },

    async hit(bucket, key, now, windowMs) {
      const sweep = now - lastSweep >= sweepEveryMs;
      if (sweep) lastSweep = now;
      return db.write(async (manager) => {
        if (sweep) await manager.query(`DELETE FROM rate_limit_counters WHERE window_end <= ?`, [now]);
        // One statement: a closed window is replaced by a new one, an open one counts the hit.
        const rows = await manager.query<Array<{ hits: number; window_end: number }>>(
          `INSERT INTO rate_limit_counters (bucket, key, window_start, window_end, hits) VALUES (?, ?, ?, ?, 1)
           ON CONFLICT (bucket, key) DO UPDATE SET
             window_start = CASE WHEN rate_limit_counters.window_end <= excluded.window_start THEN excluded.window_start ELSE rate_limit_counters.window_start END,
             hits = CASE WHEN rate_limit_counters.window_end <= excluded.window_start THEN 1 ELSE rate_limit_counters.hits + 1 END,
             window_end = CASE WHEN rate_limit_counters.window_end <= excluded.window_start THEN excluded.window_end ELSE rate_limit_counters.window_end END
           RETURNING hits, window_end`,
          [bucket, key, now, now + windowMs],
        );
        const row = rows[0];
        if (!row) throw new Error('The rate-limit counter was not written.');
        return toWindow(row);
      });
    },

    async clear(bucket, key) {
      await db.write((manager) => manager.query(`DELETE FROM rate_limit_counters WHERE bucket = ? AND key = ?`, [bucket, key]));
    },
  };
}
