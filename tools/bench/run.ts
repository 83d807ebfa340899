// `npm run bench`: runs every benchmark in tools/bench/ and rewrites docs/performance.md.
// Figures are medians and p95s over repeated runs, with a calibration baseline from the same run.
import { writeFileSync } from 'node:fs';
import { calibrationMs, machineDescription, type Figure } from './harness';
import { runLineageBench } from './lineage.bench';

const started = new Date();
const baseline = calibrationMs();
const figures: Figure[] = [...runLineageBench()];
for (const f of figures) if (f.unit === 'ms') f.ratio = f.median / baseline;

const fmt = (n: number) => (n >= 100 ? n.toFixed(0) : n >= 1 ? n.toFixed(2) : n.toFixed(3));
const rows = figures.map(
  (f) =>
    `| ${f.name} | ${fmt(f.median)} ${f.unit} | ${fmt(f.p95)} ${f.unit} | ${f.ratio === undefined ? '—' : f.ratio.toPrecision(3)} | ${f.target ?? '—'} | ${f.met === undefined ? '—' : f.met ? 'met' : 'NOT met'} | ${f.note ?? ''} |`,
);
const doc = `# Performance

<!-- Written by \`npm run bench\` (tools/bench/run.ts); do not edit by hand. -->

Measured ${started.toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineDescription()}.
These machines are shared and noisy: compare the **ratio** column (median ÷ the calibration
baseline from the same run: sorting 20,000 numbers, ${fmt(baseline)} ms here) between runs, more
than the raw times. Targets are checked here, in benchmarks, never in timed tests.

| figure | median | p95 | ratio to baseline | target | | note |
| --- | ---: | ---: | ---: | --- | --- | --- |
${rows.join('\n')}

## How the cost grows

The lineage rows at 10k, 50k and 200k parts show how building and resolving scale: building is
linear in parts + links; a resolve touches only the part's own neighbourhood, so its time should
stay flat as the catalogue grows.

The lookup benchmark (200,000 parts, 60,000 links, 1,000 typo queries against a plain fuse.js
scan of the whole catalogue) runs on its own for now: \`npx tsx tools/bench/lookup-bench.ts\`
prints its figures as JSON. Import, HTTP throughput and the reorder list join this page with the
performance issue.
`;
writeFileSync(new URL('../../docs/performance.md', import.meta.url), doc);
console.log(doc);
