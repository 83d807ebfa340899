/** Time source; injected so tests can move time forward (session expiry, token expiry). */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };

/** A clock that stands still until told to move. For tests. */
export class FakeClock implements Clock {
  private current: number;

  constructor(start: Date | number = Date.UTC(2026, 0, 15, 9, 0, 0)) {
    this.current = typeof start === 'number' ? start : start.getTime();
  }

  now(): Date {
    return new Date(this.current);
  }

  advance(ms: number): void {
    this.current += ms;
  }
}
