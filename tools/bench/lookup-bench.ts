/* eslint-disable @nx/enforce-module-boundaries -- the benchmark runs the API's own lookup service and data layer
   in this process, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// Lookup benchmark (issue 5): a generated catalogue of 200,000 parts and 60,000 links in one shop
// (plus a second shop, so the shop filter is exercised), 1,000 generated typo queries through the
// lookup service in this process, against a plain fuse.js search over the whole catalogue.
//
//   npx tsx tools/bench/lookup-bench.ts [--parts 200000] [--links 60000] [--queries 1000] [--fuse-queries 1000]
//
// --fuse-queries bounds the plain fuse.js runs (each takes most of a second at 200k); the speed
// ratio and the top-10 overlap are computed over those queries.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import Fuse from 'fuse.js';
import { partSearchQuerySchema } from '@tappet/contracts';
import { normalisePartNumber } from '@tappet/domain';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createCatalogueService } from '../../apps/api/src/modules/catalogue/catalogue.service';
import { createLookupService } from '../../apps/api/src/modules/lookup/lookup.service';
import { sqlitePartSearchIndex } from '../../apps/api/src/modules/lookup/part-search-index';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { calibrationMs, machineDescription, prng, quantile } from './harness';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

const PARTS = arg('parts', 200_000);
const LINKS = arg('links', 60_000);
const QUERIES = arg('queries', 1_000);
const FUSE_QUERIES = Math.min(arg('fuse-queries', 1_000), QUERIES);

const rnd = prng(1971);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
const digits = (n: number) => Array.from({ length: n }, () => pick('0123456789'.split(''))).join('');
const letters = 'ABCDEFGHJKLMNPRSTUVWXYZ'.split('');
// Invented wording for generated descriptions.
const things = ['cable', 'seal', 'gasket', 'bearing', 'spring', 'bracket', 'bolt', 'washer', 'switch', 'lever', 'bush', 'shim', 'valve', 'clip', 'hose', 'pipe', 'cover', 'plate', 'nut', 'pin'];
const places = ['clutch', 'brake', 'throttle', 'gearbox', 'fork', 'headlamp', 'cylinder head', 'carburettor', 'dynamo', 'kickstart', 'footrest', 'chain', 'wheel', 'exhaust', 'oil pump'];
const sides = ['', ', front', ', rear', ', left', ', right', ', inner', ', outer', ', early type', ', later type', ', oversize'];

function generatedNumber(): string {
  switch (Math.floor(rnd() * 4)) {
    case 0:
      return `${digits(2)}-${digits(4)}`;
    case 1:
      return `${pick(letters)}${pick(letters)}-${digits(4)}`;
    case 2:
      return `${pick(letters)}${pick(letters)}/${digits(5)}`;
    default:
      return `${pick(letters)}${pick(letters)}${pick(letters)}-${digits(5)}`;
  }
}

/** One or (for long keys, sometimes) two random edits to a printed number, keeping its look. */
function typo(number: string): string {
  let out = number;
  const edits = normalisePartNumber(number).length >= 8 && rnd() < 0.3 ? 2 : 1;
  for (let e = 0; e < edits; e++) {
    const positions = [...out].map((c, i) => (/[A-Z0-9]/.test(c) ? i : -1)).filter((i) => i >= 0);
    const i = pick(positions);
    const kind = Math.floor(rnd() * 4);
    const c = pick('0123456789'.split(''));
    if (kind === 0) out = out.slice(0, i) + out.slice(i + 1);
    else if (kind === 1) out = out.slice(0, i) + c + out.slice(i);
    else if (kind === 2) out = out.slice(0, i) + c + out.slice(i + 1);
    else {
      const j = positions[positions.indexOf(i) + 1];
      if (j !== undefined) out = out.slice(0, i) + out[j] + out.slice(i + 1, j) + out[i] + out.slice(j + 1);
    }
  }
  return out;
}

async function main() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-lookup-bench-'));
  const dataSource = createDataSource(path.join(dir, 'bench.sqlite'));
  await dataSource.initialize();
  await dataSource.runMigrations();
  const db = databaseFor(dataSource);
  try {
    const shopId = (await createShopWithUsers(db, systemClock, { roles: ['mechanic'], namePrefix: 'Bench Works' })).shop.id;
    const otherShopId = (await createShopWithUsers(db, systemClock, { roles: ['mechanic'], namePrefix: 'Bench Other' })).shop.id;

    const seen = new Set<string>();
    const parts: Array<{ id: string; number: string; key: string; description: string }> = [];
    while (parts.length < PARTS) {
      const number = generatedNumber();
      const key = normalisePartNumber(number);
      if (seen.has(key)) continue;
      seen.add(key);
      const description = `${pick(places)} ${pick(things)}${pick(sides)}`.replace(/^./, (c) => c.toUpperCase());
      parts.push({ id: randomUUID(), number, key, description });
    }
    const t0 = performance.now();
    const now = new Date().toISOString();
    const insertParts = async (shop: string, rows: typeof parts) => {
      for (let i = 0; i < rows.length; i += 400) {
        const chunk = rows.slice(i, i + 400);
        await db.write((m) =>
          m.query(
            `INSERT INTO parts (id, shop_id, number, key, description, origin, maker, category, unit, status, notes, created_at, updated_at) VALUES ${chunk.map(() => `(?, ?, ?, ?, ?, 'genuine', NULL, NULL, 'each', 'available', NULL, ?, ?)`).join(', ')}`,
            chunk.flatMap((p) => [p.id, shop, p.number, p.key, p.description, now, now]),
          ),
        );
      }
    };
    await insertParts(shopId, parts);
    // The other shop: a tenth as many parts with the same numbers (new ids), all would-be matches.
    await insertParts(otherShopId, parts.slice(0, Math.floor(PARTS / 10)).map((p) => ({ ...p, id: randomUUID() })));
    const links: unknown[][] = [];
    for (let n = 0; n < LINKS; n++) {
      // From an older index to a newer one: replacements never loop.
      const a = Math.floor(rnd() * (PARTS - 1));
      const b = a + 1 + Math.floor(rnd() * Math.min(50, PARTS - a - 1));
      const kind = rnd() < 0.7 ? 'replaced_by' : 'equivalent';
      links.push([randomUUID(), shopId, parts[a]!.id, kind, parts[b]!.id, parts[b]!.number, parts[b]!.key, 1, rnd() < 0.5 ? 'both' : 'one_way']);
    }
    for (let i = 0; i < links.length; i += 400) {
      const chunk = links.slice(i, i + 400);
      await db.write((m) =>
        m.query(
          `INSERT OR IGNORE INTO part_links (id, shop_id, from_part_id, kind, to_part_id, to_number, to_key, quantity, interchange) VALUES ${chunk.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?)').join(', ')}`,
          chunk.flat(),
        ),
      );
    }
    const loadMs = performance.now() - t0;

    const catalogue = createCatalogueService({ db, clock: systemClock });
    const lookup = createLookupService({ index: sqlitePartSearchIndex(() => db.reader), graphOf: catalogue.graphOf });
    const queries = Array.from({ length: QUERIES }, () => {
      const part = pick(parts);
      return { part, q: typo(part.number) };
    });

    await catalogue.graphOf(shopId); // built once per catalogue version; not part of a lookup
    for (const { q } of queries.slice(0, 20)) await lookup.search(shopId, partSearchQuerySchema.parse({ q, limit: 10 }));
    const times: number[] = [];
    const answers: string[][] = [];
    let found1 = 0;
    let found3 = 0;
    for (const { part, q } of queries) {
      const start = performance.now();
      const { results } = await lookup.search(shopId, partSearchQuerySchema.parse({ q, limit: 10 }));
      times.push(performance.now() - start);
      answers.push(results.map((r) => r.id));
      const at = results.findIndex((r) => r.id === part.id);
      if (at === 0) found1++;
      if (at >= 0 && at < 3) found3++;
    }
    const sorted = [...times].sort((a, b) => a - b);

    // The plain search: fuse.js over every part of the shop, the way one would without an index.
    const fuse = new Fuse(parts, { keys: ['number', 'key', 'description'], includeScore: true, ignoreLocation: true });
    const fuseTimes: number[] = [];
    let shared9 = 0;
    let fuseTop3 = 0;
    for (let i = 0; i < FUSE_QUERIES; i++) {
      const start = performance.now();
      const top = fuse.search(queries[i]!.q, { limit: 10 }).map((r) => r.item.id);
      fuseTimes.push(performance.now() - start);
      if (top.slice(0, 3).includes(queries[i]!.part.id)) fuseTop3++;
      const ours = new Set(answers[i]);
      if (top.filter((id) => ours.has(id)).length >= Math.min(9, top.length)) shared9++;
    }
    const fuseSorted = [...fuseTimes].sort((a, b) => a - b);
    const oursOnFuseSet = [...times.slice(0, FUSE_QUERIES)].sort((a, b) => a - b);

    const p95 = quantile(sorted, 0.95);
    const speedup = quantile(fuseSorted, 0.5) / quantile(oursOnFuseSet, 0.5);
    const overlap = shared9 / FUSE_QUERIES;
    const report = {
      machine: machineDescription(),
      calibrationMs: Number(calibrationMs().toFixed(2)),
      catalogue: { parts: PARTS, links: LINKS, otherShopParts: Math.floor(PARTS / 10), loadSeconds: Number((loadMs / 1000).toFixed(1)) },
      lookup: { queries: QUERIES, medianMs: Number(quantile(sorted, 0.5).toFixed(2)), p95Ms: Number(p95.toFixed(2)), target: 'p95 ≤ 25 ms', met: p95 <= 25 },
      recall: { firstPlace: `${((100 * found1) / QUERIES).toFixed(1)} %`, top3: `${((100 * found3) / QUERIES).toFixed(1)} %` },
      plainFuse: { queries: FUSE_QUERIES, medianMs: Number(quantile(fuseSorted, 0.5).toFixed(1)), p95Ms: Number(quantile(fuseSorted, 0.95).toFixed(1)), top3: `${((100 * fuseTop3) / Math.max(1, FUSE_QUERIES)).toFixed(1)} %` },
      speedup: { times: Number(speedup.toFixed(1)), target: '≥ 10×', met: speedup >= 10 },
      overlap: { queriesSharing9of10: `${(100 * overlap).toFixed(1)} %`, target: '≥ 90 %', met: overlap >= 0.9 },
    };
    console.log(JSON.stringify(report, null, 2));
  } finally {
    await dataSource.destroy();
    if (!process.env.KEEP_BENCH_DB) fs.rmSync(dir, { recursive: true, force: true });
    else console.log(`kept ${dir}`);
  }
}

await main();
