// Tiny benchmark harness: repeated timings, median and p95, and a calibration baseline measured in
// the same run so figures from a busy, shared machine can be compared as ratios.
import { cpus, totalmem, type as osType, release } from 'node:os';
import { performance } from 'node:perf_hooks';
import { seededRandom } from '@tappet/domain';

export interface Figure {
  name: string;
  unit: 'ms' | 's' | 'MB' | 'req/s' | '×' | '%';
  median: number;
  p95: number;
  /** Human-readable target, e.g. "p95 ≤ 2 ms". */
  target?: string;
  /** Whether the target is met (undefined when there is no target). */
  met?: boolean;
  /** Median divided by the calibration baseline's median. */
  ratio?: number;
  note?: string;
}

export function quantile(sorted: number[], q: number): number {
  if (sorted.length === 0) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[i]!;
}

/** Times `fn` `runs` times (after `warmup` untimed runs); returns the sorted durations in ms. */
export function timeRuns(fn: (i: number) => void, runs: number, warmup = Math.min(50, runs)): number[] {
  for (let i = 0; i < warmup; i++) fn(i);
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn(i);
    out.push(performance.now() - t0);
  }
  return out.sort((a, b) => a - b);
}

/** A figure measured once (a count, a ratio, a percentage): median and p95 are the value. */
export function single(name: string, unit: Figure['unit'], value: number, extra: Partial<Figure> = {}): Figure {
  return { name, unit, median: value, p95: value, ...extra };
}

export function summarise(name: string, sortedMs: number[], extra: Partial<Figure> = {}): Figure {
  return { name, unit: 'ms', median: quantile(sortedMs, 0.5), p95: quantile(sortedMs, 0.95), ...extra };
}

/**
 * The calibration baseline: sorting 20,000 pseudo-random numbers. It exercises the same CPU and
 * allocator as the code under test, so a slow or busy machine slows both alike.
 */
export function calibrationMs(): number {
  let seed = 12345;
  const data = Array.from({ length: 20_000 }, () => (seed = (seed * 1103515245 + 12345) % 2 ** 31));
  const runs = timeRuns(() => [...data].sort((a, b) => a - b), 40, 10);
  return quantile(runs, 0.5);
}

export function machineDescription(): string {
  const c = cpus();
  return `${c.length} × ${c[0]?.model ?? 'unknown CPU'}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, ${osType()} ${release()}, Node ${process.version}`;
}

/** A deterministic PRNG (mulberry32, libs/domain) so generated data is the same in every run. */
export const prng = seededRandom;
