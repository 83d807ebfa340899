// docs/performance.md as data: one section per benchmark, each with its own measurement date,
// machine and calibration baseline, so `npm run bench -- --only X` replaces X's section and keeps
// the others (a report can be completed piece by piece on a quiet machine). The "how the cost
// grows" table is computed from whatever sections the page holds.
import type { Figure } from './harness';

/** One benchmark's figures from one run. */
export interface Section {
  bench: string;
  /** "2026-12-02 06:35 UTC" */
  measured: string;
  machine: string;
  /** The calibration baseline of that run, in ms. */
  baselineMs: number;
  /** Table rows as printed (markdown), in order. */
  rows: string[];
}

const fmt = (n: number) => (n >= 100 ? n.toFixed(0) : n >= 1 ? n.toFixed(2) : n.toFixed(3));

/** A whole number stays whole (a Lighthouse score of 81 is not "81.00"). */
const show = (n: number) => (Number.isInteger(n) ? String(n) : fmt(n));

export function figureRow(f: Figure): string {
  return `| ${f.name} | ${show(f.median)} ${f.unit} | ${f.median === f.p95 ? '' : `${show(f.p95)} ${f.unit}`} | ${f.ratio === undefined ? '—' : f.ratio.toPrecision(3)} | ${f.target ?? '—'} | ${f.met === undefined ? '—' : f.met ? 'met' : 'NOT met'} | ${f.note ?? ''} |`;
}

const TABLE_HEAD = `| figure | median | p95 | ratio to baseline | target | | note |
| --- | ---: | ---: | ---: | --- | --- | --- |`;

const sectionStart = (bench: string) => `<!-- bench:${bench} -->`;
const SECTION_END = '<!-- /bench -->';

export function renderSection(s: Section): string {
  return `${sectionStart(s.bench)}
### ${s.bench}

Measured ${s.measured} on ${s.machine}; calibration baseline ${fmt(s.baselineMs)} ms.

${TABLE_HEAD}
${s.rows.join('\n')}
${SECTION_END}`;
}

/** The sections of a page written by renderPage (an older or hand-made page yields none). */
export function parseSections(page: string): Section[] {
  const out: Section[] = [];
  const re = /<!-- bench:([\w-]+) -->\n### [^\n]*\n\nMeasured (.+?) on (.+?); calibration baseline ([\d.]+) ms\.\n\n[^\n]*\n[^\n]*\n([\s\S]*?)\n?<!-- \/bench -->/g;
  for (const m of page.matchAll(re)) {
    out.push({ bench: m[1]!, measured: m[2]!, machine: m[3]!, baselineMs: Number(m[4]), rows: m[5]!.split('\n').filter((l) => l.startsWith('|')) });
  }
  return out;
}

/** The page's sections with `fresh` replacing those of the same benchmark, in `order`. */
export function mergeSections(old: Section[], fresh: Section[], order: string[]): Section[] {
  const byBench = new Map(old.map((s) => [s.bench, s]));
  for (const s of fresh) byBench.set(s.bench, s);
  const rank = (b: string) => (order.includes(b) ? order.indexOf(b) : order.length);
  return [...byBench.values()].sort((a, b) => rank(a.bench) - rank(b.bench));
}

// ---- How the cost grows ----

/** The quantities the issue asks to follow as the catalogue grows, and the rows that hold them. */
export const growthSeries: Array<{ what: string; row: RegExp }> = [
  { what: 'search (lookup of a typo’d number, median)', row: /^lookup: typo'd number, ([\d,]+) parts$/ },
  { what: 'resolve (current parts + can fill, median)', row: /^lineage: resolve \(current parts \+ can fill\), ([\d,]+) parts$/ },
  { what: 'import (commit of new parts)', row: /^import: commit ([\d,]+) new parts/ },
  { what: 'reorder list (service call, median)', row: /^reorder list: ([\d,]+) stocked parts/ },
];
export const growthSizes = [10_000, 50_000, 200_000];

const UNIT_MS: Record<string, number> = { ms: 1, s: 1000 };

/** Figure name → median in ms, for every timed row on the page. */
export function mediansMs(sections: Section[]): Map<string, number> {
  const out = new Map<string, number>();
  for (const s of sections) {
    for (const row of s.rows) {
      const cells = row.split('|').map((c) => c.trim());
      const m = /^([\d.]+) (ms|s)$/.exec(cells[2] ?? '');
      if (m) out.set(cells[1]!, Number(m[1]) * UNIT_MS[m[2]!]!);
    }
  }
  return out;
}

/**
 * The growth exponent between two sizes: time ∝ size^k. k ≈ 0 is flat, 1 linear, 2 quadratic.
 * The verdict takes the steepest step, so a cost that turns worse at the large end is not averaged away.
 */
export function growthVerdict(points: Array<{ size: number; ms: number }>): { exponents: number[]; verdict: string } {
  const exponents: number[] = [];
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!;
    const b = points[i]!;
    exponents.push(Math.log(b.ms / a.ms) / Math.log(b.size / a.size));
  }
  const k = Math.max(...exponents);
  const verdict = k <= 0.2 ? 'flat' : k <= 0.85 ? 'sublinear' : k <= 1.2 ? 'linear' : 'worse than linear';
  return { exponents, verdict };
}

export function renderGrowth(sections: Section[]): string {
  const medians = mediansMs(sections);
  const head = `| quantity | ${growthSizes.map((n) => `${n / 1000}k parts`).join(' | ')} | growth exponent per step | verdict |
| --- | ${growthSizes.map(() => '---:').join(' | ')} | --- | --- |`;
  const lines = growthSeries.map(({ what, row }) => {
    const bySize = new Map<number, number>();
    for (const [name, ms] of medians) {
      const m = row.exec(name);
      if (m) bySize.set(Number(m[1]!.replace(/,/g, '')), ms);
    }
    const points = growthSizes.filter((n) => bySize.has(n)).map((n) => ({ size: n, ms: bySize.get(n)! }));
    const cells = growthSizes.map((n) => (bySize.has(n) ? `${fmt(bySize.get(n)!)} ms` : 'not measured'));
    if (points.length < 2) return `| ${what} | ${cells.join(' | ')} | — | not enough sizes measured |`;
    const { exponents, verdict } = growthVerdict(points);
    return `| ${what} | ${cells.join(' | ')} | ${exponents.map((k) => k.toFixed(2)).join(', ')} | ${verdict} |`;
  });
  return `${head}\n${lines.join('\n')}`;
}

export function renderPage(sections: Section[], descriptions: string): string {
  return `# Performance

<!-- Written by \`npm run bench\` (tools/bench/run.ts); do not edit by hand. -->

Each benchmark's section below shows when and where it was last measured: \`npm run bench -- --only X\`
replaces X's section and keeps the others. These machines are shared and noisy: compare the **ratio**
column (median ÷ the calibration baseline measured in the same run: sorting 20,000 numbers) between
runs, more than the raw times. Targets are checked here, in benchmarks, never in timed tests. A
figure measured once shows its value in the median column only.

## How the cost grows

Computed from the figures below. The growth exponent k of each step between sizes (time ∝ parts^k):
about 0 is flat, 1 linear, 2 quadratic; the verdict takes the steepest step (flat ≤ 0.2, sublinear
≤ 0.85, linear ≤ 1.2, worse above). Fixed costs make small sizes look cheap, so a step well below 1
is common for linear work. Figures of one quantity come from one run, but different quantities may
come from different runs.

${renderGrowth(sections)}

## Figures

${sections.map(renderSection).join('\n\n')}

## What each benchmark does

${descriptions}

The initial JavaScript budget (200 KB gzipped) is checked by \`npm test\` on every run
(tools/scripts/check-bundle-size.mjs), not here.
`;
}
