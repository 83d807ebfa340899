import { describe, expect, it } from 'vitest';
import { growthVerdict, mergeSections, parseSections, renderGrowth, renderPage, type Section } from './report';

const section = (bench: string, measured: string, rows: string[]): Section => ({ bench, measured, machine: '2 × Test CPU, 8 GiB', baselineMs: 16.3, rows });

describe('the performance page', () => {
  it('reads back the sections it wrote, dates and rows included', () => {
    const sections = [
      section('lineage', '2026-12-01 06:35 UTC', ['| lineage: resolve (current parts + can fill), 10,000 parts | 0.009 ms | 0.039 ms | 0.000580 | — | — |  |']),
      section('import', '2026-12-02 09:10 UTC', ['| import: commit 10,000 new parts (CSV 0.4 MB) | 3.61 s |  | — | — | — | one run |', '| import: peak memory of the process, 10,000 rows | 178 MB |  | — | — | — |  |']),
    ];
    expect(parseSections(renderPage(sections, '- **lineage** — …'))).toEqual(sections);
  });

  it('replaces the sections of the benchmarks run and keeps the others, in the benchmarks’ order', () => {
    const old = [section('lineage', '2026-12-01 06:35 UTC', ['| a | 1 ms |']), section('import', '2026-12-01 06:40 UTC', ['| b | 2 s |'])];
    const fresh = [section('import', '2026-12-02 10:00 UTC', ['| b | 3 s |']), section('reorder', '2026-12-02 10:05 UTC', ['| c | 4 ms |'])];
    const merged = mergeSections(old, fresh, ['lineage', 'lookup', 'import', 'reorder']);
    expect(merged.map((s) => [s.bench, s.measured, s.rows])).toEqual([
      ['lineage', '2026-12-01 06:35 UTC', ['| a | 1 ms |']],
      ['import', '2026-12-02 10:00 UTC', ['| b | 3 s |']],
      ['reorder', '2026-12-02 10:05 UTC', ['| c | 4 ms |']],
    ]);
  });

  it('finds no sections in a page of another shape', () => {
    expect(parseSections('# Performance\n\n| figure | median |\n| x | 1 ms |\n')).toEqual([]);
  });
});

describe('how the cost grows', () => {
  const sizes = [10_000, 50_000, 200_000];

  it('calls time proportional to size linear, and a square of it worse than linear', () => {
    expect(growthVerdict(sizes.map((size) => ({ size, ms: size / 100 })))).toEqual({ exponents: [1, 1].map((k) => expect.closeTo(k, 6)), verdict: 'linear' });
    expect(growthVerdict(sizes.map((size) => ({ size, ms: (size / 1000) ** 2 }))).verdict).toBe('worse than linear');
    expect(growthVerdict(sizes.map((size) => ({ size, ms: 5 }))).verdict).toBe('flat');
  });

  it('judges by the steepest step, so a cost that turns bad at the large end shows', () => {
    const { exponents, verdict } = growthVerdict([
      { size: 10_000, ms: 100 },
      { size: 50_000, ms: 200 },
      { size: 200_000, ms: 3200 },
    ]);
    expect(exponents[0]).toBeLessThan(0.5);
    expect(exponents[1]).toBeCloseTo(2, 6);
    expect(verdict).toBe('worse than linear');
  });

  it('reads the figures from the page, seconds as well as milliseconds, and says what is missing', () => {
    const table = renderGrowth([
      section('import', '2026-12-02 09:10 UTC', [
        '| import: commit 10,000 new parts (CSV 0.4 MB) | 2.00 s |  | — | — | — | one run |',
        '| import: commit 50,000 new parts (CSV 1.9 MB) | 10.00 s |  | — | — | — | one run |',
        '| import: commit 200,000 new parts (CSV 7.5 MB) | 40.00 s |  | — | — | — | one run |',
      ]),
      section('reorder', '2026-12-02 10:05 UTC', ['| reorder list: 10,000 stocked parts | 300 ms | 320 ms | 18.4 | — | — |  |']),
    ]);
    expect(table).toContain('| import (commit of new parts) | 2000 ms | 10000 ms | 40000 ms | 1.00, 1.00 | linear |');
    expect(table).toContain('| reorder list (service call, median) | 300 ms | not measured | not measured | — | not enough sizes measured |');
    expect(table).toContain('| search (lookup of a typo’d number, median) | not measured | not measured | not measured |');
  });
});
