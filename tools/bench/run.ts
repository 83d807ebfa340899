// `npm run bench`: runs benchmarks in tools/bench/ and updates docs/performance.md.
// Figures are medians and p95s over repeated runs, with a calibration baseline from the same run.
//   npm run bench                          every benchmark (about 10 minutes on 2 quiet cores)
//   npm run bench -- --only lookup,http    some of them (lineage, lookup, import, reorder, http,
//                                          lighthouse); their sections are replaced, the other
//                                          benchmarks' sections are kept with their own dates
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { calibrationMs, machineDescription, type Figure } from './harness';
import { runHttpBench } from './http.bench';
import { runImportBench } from './import.bench';
import { runLighthouseBench } from './lighthouse.bench';
import { runLineageBench } from './lineage.bench';
import { runLookupBench } from './lookup.bench';
import { runReorderBench } from './reorder.bench';
import { figureRow, mergeSections, parseSections, renderPage, type Section } from './report';

const benches: Record<string, () => Figure[] | Promise<Figure[]>> = {
  lineage: () => runLineageBench(),
  lookup: () => runLookupBench(),
  import: () => runImportBench(),
  reorder: () => runReorderBench(),
  http: () => runHttpBench(),
  lighthouse: () => runLighthouseBench(),
};
const order = Object.keys(benches);
const onlyAt = process.argv.indexOf('--only');
const chosen = onlyAt >= 0 ? (process.argv[onlyAt + 1] ?? '').split(',') : order;
for (const name of chosen) if (!benches[name]) throw new Error(`No benchmark "${name}"; choose from ${order.join(', ')}.`);

const page = new URL('../../docs/performance.md', import.meta.url);
const machine = machineDescription();
const baseline = calibrationMs();
const fresh: Section[] = [];
for (const name of chosen) {
  console.error(`▶ ${name}`);
  const started = new Date();
  // The machine is shared: the load when a benchmark starts says how far to trust its times.
  const load = loadavg()[0]!.toFixed(1);
  const figures = await benches[name]!();
  // The baseline ratio only means something for times measured in this process's own units.
  for (const f of figures) if (f.unit === 'ms' && name !== 'http' && name !== 'lighthouse') f.ratio = f.median / baseline;
  fresh.push({ bench: name, measured: `${started.toISOString().slice(0, 16).replace('T', ' ')} UTC (load average ${load} at the start)`, machine, baselineMs: baseline, rows: figures.map(figureRow) });
}

const old = existsSync(page) ? parseSections(readFileSync(page, 'utf8')) : [];
const doc = renderPage(mergeSections(old, fresh, order), descriptions());
writeFileSync(page, doc);
console.log(doc);

function descriptions(): string {
  return `- **lineage** — generated catalogues (chains of replacements, splits, kits, equivalents) at 10k,
  50k and 200k parts; building the graph is linear in parts + links, and a resolve touches only
  the part's neighbourhood, so its time should stay flat as the catalogue grows.
- **lookup** — generated catalogues at 10k, 50k and 200k parts (links at 30 %, and a second shop
  with the same numbers) and 1,000 typo'd numbers through the lookup service; at 200k also a plain
  fuse.js scan of the whole catalogue over the first 100 queries, for the speed ratio and the
  top-10 agreement (docs/decisions/012 explains why that agreement stays low).
- **import** — a CSV of new parts committed at 10k, 50k, 100k and 200k rows, each in a fresh
  process so its peak memory (ru_maxrss) is its own.
- **reorder** — shops generated straight into SQLite (after the migrations) with 10k, 50k and 200k
  stocked parts, two years of issues, receipts and job returns, replacement links, suppliers and
  open orders; the reorder-list service call timed over repeated runs.
- **http** — the API in its own process on loopback (request logging on, as \`npm start\` runs
  it), loaded by autocannon from the benchmark process with 10 connections for 10 s: a trivial
  route as the ceiling, an authenticated read of the shop's settings as the floor under every shop
  route (session, membership, permissions, checks), authenticated lookups of typo'd numbers over
  50,000 parts, and the same while a 50,000-row import commits; each with the API process's CPU
  time per request (from /proc), which a shared machine disturbs less than the throughput.
- **lighthouse** — the demo's lookup and part pages, signed in as the demo mechanic, in Debian's
  Chromium, with Lighthouse 12's default (mobile, simulated slow network and CPU) and desktop
  settings; each page five times, and the figures are the median run's (the note lists every
  run's score).`;
}
