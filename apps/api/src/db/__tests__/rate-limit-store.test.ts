// The database's rate-limit counters: fixed windows opened by the first hit, counted until they
// close, cleared on demand, and closed windows swept away now and then.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { FakeClock } from '../../lib/clock';
import { RateLimiter } from '../../lib/rate-limiter';
import { openTestDatabase } from '../../test-support/test-app';
import { databaseRateLimitStore } from '../rate-limit-store';

let database: Awaited<ReturnType<typeof openTestDatabase>>;
beforeEach(async () => {
  database = await openTestDatabase();
});
afterEach(() => database.close());

const rows = () => database.db.reader.query<Array<{ bucket: string; key: string; hits: number }>>(`SELECT bucket, key, hits FROM rate_limit_counters ORDER BY bucket, key`);

describe('databaseRateLimitStore', () => {
  it('opens a window on the first hit, counts in it, and opens a new one after it closes', async () => {
    const store = databaseRateLimitStore(database.db);
    expect(await store.peek('b', 'k', 1000)).toBeNull();
    expect(await store.hit('b', 'k', 1000, 500)).toEqual({ hits: 1, endsAt: 1500 });
    expect(await store.hit('b', 'k', 1200, 500)).toEqual({ hits: 2, endsAt: 1500 });
    expect(await store.peek('b', 'k', 1499)).toEqual({ hits: 2, endsAt: 1500 });
    expect(await store.peek('b', 'k', 1500)).toBeNull();
    expect(await store.hit('b', 'k', 1600, 500)).toEqual({ hits: 1, endsAt: 2100 });
  });

  it('keeps buckets and keys apart and clears one key only', async () => {
    const store = databaseRateLimitStore(database.db);
    await store.hit('sign-in-ip', 'a', 0, 1000);
    await store.hit('sign-in-ip', 'b', 0, 1000);
    await store.hit('reset-ip', 'a', 0, 1000);
    await store.clear('sign-in-ip', 'a');
    expect(await rows()).toEqual([
      { bucket: 'reset-ip', key: 'a', hits: 1 },
      { bucket: 'sign-in-ip', key: 'b', hits: 1 },
    ]);
  });

  it('deletes closed windows when it counts a hit, at most once a minute', async () => {
    const store = databaseRateLimitStore(database.db);
    await store.hit('b', 'old', 0, 1000);
    await store.hit('b', 'still-open', 500, 10 * 60_000);
    // Closed since 1000 ms, but the last sweep was at 0: kept until a minute has passed.
    await store.hit('b', 'new', 30_000, 1000);
    expect((await rows()).map((r) => r.key)).toEqual(['new', 'old', 'still-open']);
    await store.hit('b', 'newer', 61_000, 1000);
    expect((await rows()).map((r) => r.key)).toEqual(['newer', 'still-open']);
  });
});

describe('RateLimiter on the database store', () => {
  it('lets `limit` hits through per window and then says how long to wait', async () => {
    const clock = new FakeClock();
    const limiter = new RateLimiter('test', { limit: 2, windowMs: 60_000 }, clock, databaseRateLimitStore(database.db));
    expect(await limiter.take('k')).toBe(0);
    clock.advance(10_000);
    expect(await limiter.retryAfterSeconds('k')).toBe(0);
    expect(await limiter.take('k')).toBe(0);
    expect(await limiter.retryAfterSeconds('k')).toBe(50);
    expect(await limiter.take('k')).toBe(50);
    // A refused hit does not push the window's end out.
    clock.advance(50_000);
    expect(await limiter.take('k')).toBe(0);
    await limiter.record('k');
    await limiter.reset('k');
    expect(await limiter.retryAfterSeconds('k')).toBe(0);
  });
});
