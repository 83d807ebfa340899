// `npm run bench`: runs every benchmark in tools/bench/ and rewrites docs/performance.md.
// Figures are medians and p95s over repeated runs, with a calibration baseline from the same run.
//   npm run bench                      every benchmark (about 15 minutes on 2 cores)
//   npm run bench -- --only lookup,http    some of them (lineage, lookup, import, http, lighthouse);
//                                          the page is still rewritten, with only those rows
import { writeFileSync } from 'node:fs';
import { calibrationMs, machineDescription, type Figure } from './harness';
import { runHttpBench } from './http.bench';
import { runImportBench } from './import.bench';
import { runLighthouseBench } from './lighthouse.bench';
import { runLineageBench } from './lineage.bench';
import { runLookupBench } from './lookup.bench';

const benches: Record<string, () => Figure[] | Promise<Figure[]>> = {
  lineage: () => runLineageBench(),
  lookup: () => runLookupBench(),
  import: () => runImportBench(),
  http: () => runHttpBench(),
  lighthouse: () => runLighthouseBench(),
};
const onlyAt = process.argv.indexOf('--only');
const chosen = onlyAt >= 0 ? (process.argv[onlyAt + 1] ?? '').split(',') : Object.keys(benches);
for (const name of chosen) if (!benches[name]) throw new Error(`No benchmark "${name}"; choose from ${Object.keys(benches).join(', ')}.`);

const started = new Date();
const baseline = calibrationMs();
const figures: Figure[] = [];
for (const name of chosen) {
  console.error(`▶ ${name}`);
  figures.push(...(await benches[name]!()));
}
// The baseline ratio only means something for times measured in this process's own units.
for (const f of figures) if (f.unit === 'ms' && !f.name.startsWith('HTTP') && !f.name.startsWith('Lighthouse')) f.ratio = f.median / baseline;

const fmt = (n: number) => (n >= 100 ? n.toFixed(0) : n >= 1 ? n.toFixed(2) : n.toFixed(3));
const rows = figures.map(
  (f) =>
    `| ${f.name} | ${fmt(f.median)} ${f.unit} | ${f.median === f.p95 ? '' : `${fmt(f.p95)} ${f.unit}`} | ${f.ratio === undefined ? '—' : f.ratio.toPrecision(3)} | ${f.target ?? '—'} | ${f.met === undefined ? '—' : f.met ? 'met' : 'NOT met'} | ${f.note ?? ''} |`,
);
const doc = `# Performance

<!-- Written by \`npm run bench\` (tools/bench/run.ts); do not edit by hand. -->

Measured ${started.toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineDescription()}; benchmarks run: ${chosen.join(', ')}.
These machines are shared and noisy: compare the **ratio** column (median ÷ the calibration
baseline from the same run: sorting 20,000 numbers, ${fmt(baseline)} ms here) between runs, more
than the raw times. Targets are checked here, in benchmarks, never in timed tests. A figure
measured once shows its value in the median column only.

| figure | median | p95 | ratio to baseline | target | | note |
| --- | ---: | ---: | ---: | --- | --- | --- |
${rows.join('\n')}

## What each benchmark does

- **lineage** — generated catalogues (chains of replacements, splits, kits, equivalents) at 10k,
  50k and 200k parts; building the graph is linear in parts + links, and a resolve touches only
  the part's neighbourhood, so its time should stay flat as the catalogue grows.
- **lookup** — generated catalogues at 10k, 50k and 200k parts (links at 30 %, and a second shop
  with the same numbers) and 1,000 typo'd numbers through the lookup service; at 200k also a plain
  fuse.js scan of the whole catalogue over the first 100 queries, for the speed ratio and the
  top-10 agreement (docs/decisions/012 explains why that agreement stays low).
- **import** — a CSV of new parts committed at 10k, 50k, 100k and 200k rows, each in a fresh
  process so its peak memory (ru_maxrss) is its own.
- **http** — the API in its own process on loopback (request logging on, as \`npm start\` runs
  it), loaded by autocannon from the benchmark process with 10 connections for 10 s: a trivial
  route as the ceiling, authenticated lookups of typo'd numbers over 50,000 parts, and the same
  while a 50,000-row import commits.
- **lighthouse** — the demo's lookup and part pages, signed in as the demo mechanic, in Debian's
  Chromium, with Lighthouse 12's default (mobile, simulated slow network and CPU) and desktop
  settings.

The initial JavaScript budget (200 KB gzipped) is checked by \`npm test\` on every run
(tools/scripts/check-bundle-size.mjs), not here.
`;
writeFileSync(new URL('../../docs/performance.md', import.meta.url), doc);
console.log(doc);
