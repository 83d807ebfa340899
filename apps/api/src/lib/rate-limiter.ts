import type { Clock } from './clock';

/** Storage for rate-limit counters, behind an interface so a shared store can replace memory. */
export interface RateLimitStore {
  /** Timestamps (ms) of the hits recorded for `key` that are newer than `since`. */
  hits(key: string, since: number): number[];
  add(key: string, at: number): void;
  clear(key: string): void;
}

/** Keeps counters in this process. Enough for the single-process SQLite deployment. */
export class MemoryRateLimitStore implements RateLimitStore {
  private readonly entries = new Map<string, number[]>();

  hits(key: string, since: number): number[] {
    const kept = (this.entries.get(key) ?? []).filter((t) => t > since);
    if (kept.length === 0) this.entries.delete(key);
    else this.entries.set(key, kept);
    return kept;
  }

  add(key: string, at: number): void {
    const list = this.entries.get(key) ?? [];
    list.push(at);
    this.entries.set(key, list);
    // Bound memory: forget the oldest key when an attacker sprays many distinct keys.
    if (this.entries.size > 50_000) {
      const oldest = this.entries.keys().next().value;
      if (oldest !== undefined) this.entries.delete(oldest);
    }
  }

  clear(key: string): void {
    this.entries.delete(key);
  }
}

export interface RateLimitRule {
  limit: number;
  windowMs: number;
}

/** A sliding-window counter: at most `limit` recorded hits per key within `windowMs`. */
export class RateLimiter {
  constructor(
    private readonly rule: RateLimitRule,
    private readonly clock: Clock,
    private readonly store: RateLimitStore = new MemoryRateLimitStore(),
  ) {}

  /** Seconds until the key may try again, or 0 when it is not limited. */
  retryAfterSeconds(key: string): number {
    const now = this.clock.now().getTime();
    const hits = this.store.hits(key, now - this.rule.windowMs);
    if (hits.length < this.rule.limit) return 0;
    const freedAt = (hits[hits.length - this.rule.limit] ?? now) + this.rule.windowMs;
    return Math.max(1, Math.ceil((freedAt - now) / 1000));
  }

  record(key: string): void {
    this.store.add(key, this.clock.now().getTime());
  }

  reset(key: string): void {
    this.store.clear(key);
  }
}
