import type { Clock } from './clock';

export interface RateLimitRule {
  limit: number;
  windowMs: number;
}

/** The counting window of one key: hits counted since it opened, and when it closes (ms). */
export interface RateWindow {
  hits: number;
  endsAt: number;
}

/**
 * Storage for rate-limit counters: the database's (db/rate-limit-store.ts), so that every API
 * process on one database counts against the same allowance.
 *
 * Windows are fixed: the first hit opens one of `windowMs`, later hits count in it until it
 * closes, and the next hit after that opens a new one.
 */
export interface RateLimitStore {
  /** The open window of `key` in `bucket` at `now`, or null when none is open. */
  peek(bucket: string, key: string, now: number): Promise<RateWindow | null>;
  /** Counts one hit (opening a window when none is open) and returns the window after it. */
  hit(bucket: string, key: string, now: number, windowMs: number): Promise<RateWindow>;
  /** Forgets the key's window (a successful sign-in clears the account's failures). */
  clear(bucket: string, key: string): Promise<void>;
}

/** Seconds until a window with `hits` counted lets the next one through, or 0 when it does now. */
function waitSeconds(window: RateWindow | null, limit: number, now: number): number {
  if (!window || window.hits < limit) return 0;
  return Math.max(1, Math.ceil((window.endsAt - now) / 1000));
}

/** At most `limit` hits per key in a fixed window of `windowMs`, counted under one bucket name. */
export class RateLimiter {
  constructor(
    private readonly bucket: string,
    private readonly rule: RateLimitRule,
    private readonly clock: Clock,
    private readonly store: RateLimitStore,
  ) {}

  /** Seconds until the key may try again, or 0 when it is not limited. Counts nothing. */
  async retryAfterSeconds(key: string): Promise<number> {
    const now = this.clock.now().getTime();
    return waitSeconds(await this.store.peek(this.bucket, key, now), this.rule.limit, now);
  }

  /** Counts a hit (a failed sign-in, say) whatever the current count. */
  async record(key: string): Promise<void> {
    await this.store.hit(this.bucket, key, this.clock.now().getTime(), this.rule.windowMs);
  }

  /**
   * Counts a hit and says whether it was within the limit: 0 when it was, else the seconds to wait.
   * One store call, so two processes cannot both take the last place in a window.
   */
  async take(key: string): Promise<number> {
    const now = this.clock.now().getTime();
    const window = await this.store.hit(this.bucket, key, now, this.rule.windowMs);
    return window.hits <= this.rule.limit ? 0 : waitSeconds(window, this.rule.limit, now);
  }

  async reset(key: string): Promise<void> {
    await this.store.clear(this.bucket, key);
  }
}
