/* eslint-disable @nx/enforce-module-boundaries -- the benchmark runs the API's own lookup service and data layer
   in this process, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// Lookup (issues 5 and 14): a generated catalogue at 10k, 50k and 200k parts (links at 30 %, a
// second shop holding a tenth as many parts with the same numbers, so the shop filter is exercised),
// typo'd queries through the lookup service, and at the largest size a plain fuse.js scan of the
// whole catalogue for the speed ratio and the top-10 agreement.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { randomUUID } from 'node:crypto';
import Fuse from 'fuse.js';
import { partSearchQuerySchema } from '@tappet/contracts';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createCatalogueService } from '../../apps/api/src/modules/catalogue/catalogue.service';
import { createLookupService } from '../../apps/api/src/modules/lookup/lookup.service';
import { sqlitePartSearchIndex } from '../../apps/api/src/modules/lookup/part-search-index';
import { memoryPartSearchIndex } from '../../apps/api/src/modules/lookup/memory-part-search-index';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { generateParts, insertLinks, insertParts, pickWith, typo } from './catalogue-gen';
import { prng, quantile, single, summarise, type Figure } from './harness';

export interface LookupBenchOptions {
  sizes?: number[];
  queries?: number;
  /** Plain fuse.js runs at the largest size (each scans the whole catalogue: most of a second at 200k). */
  fuseQueries?: number;
}

export async function runLookupBench(options: LookupBenchOptions = {}): Promise<Figure[]> {
  const sizes = options.sizes ?? [10_000, 50_000, 200_000];
  const queryCount = options.queries ?? 1_000;
  const largest = Math.max(...sizes);
  const figures: Figure[] = [];
  for (const size of sizes) {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-lookup-bench-'));
    const dataSource = createDataSource(path.join(dir, 'bench.sqlite'));
    await dataSource.initialize();
    await dataSource.runMigrations();
    const db = databaseFor(dataSource);
    try {
      const shopId = (await createShopWithUsers(db, systemClock, { roles: ['mechanic'], namePrefix: 'Bench Works' })).shop.id;
      const otherShopId = (await createShopWithUsers(db, systemClock, { roles: ['mechanic'], namePrefix: 'Bench Other' })).shop.id;
      const parts = generateParts(size);
      await insertParts(db, shopId, parts);
      await insertParts(db, otherShopId, parts.slice(0, Math.floor(size / 10)).map((p) => ({ ...p, id: randomUUID() })));
      await insertLinks(db, shopId, parts, Math.round(size * 0.3));

      const catalogue = createCatalogueService({ db, clock: systemClock });
      // The app's index (in memory, docs/decisions/014) and the SQLite FTS5 one it replaced, on the same queries.
      const memoryIndex = memoryPartSearchIndex({ reader: () => db.reader, versionOf: catalogue.graphOf });
      const lookup = createLookupService({ index: memoryIndex, graphOf: catalogue.graphOf });
      const sqliteLookup = createLookupService({ index: sqlitePartSearchIndex(() => db.reader), graphOf: catalogue.graphOf });
      const rnd = prng(size);
      const pick = pickWith(rnd);
      const queries = Array.from({ length: queryCount }, () => {
        const part = pick(parts);
        return { part, q: typo(part.number, rnd) };
      });
      await catalogue.graphOf(shopId); // built once per catalogue version, not per lookup
      const heapBefore = process.memoryUsage().heapUsed;
      const buildStart = performance.now();
      await memoryIndex.byKey(shopId, 'X'); // the shop's index, built once per catalogue version
      const buildMs = performance.now() - buildStart;
      const heapMb = (process.memoryUsage().heapUsed - heapBefore) / 2 ** 20;
      figures.push(single(`lookup: in-memory index build, ${size.toLocaleString('en')} parts`, 'ms', buildMs, { note: `once per catalogue version; heap grew about ${heapMb.toFixed(0)} MB` }));

      const measure = async (service: typeof lookup) => {
        for (const { q } of queries.slice(0, 20)) await service.search(shopId, partSearchQuerySchema.parse({ q, limit: 10 }));
        const times: number[] = [];
        const answers: string[][] = [];
        let top3 = 0;
        for (const { part, q } of queries) {
          const start = performance.now();
          const { results } = await service.search(shopId, partSearchQuerySchema.parse({ q, limit: 10 }));
          times.push(performance.now() - start);
          answers.push(results.map((r) => r.id));
          if (results.slice(0, 3).some((r) => r.id === part.id)) top3++;
        }
        return { times, answers, top3 };
      };
      const { times, answers, top3 } = await measure(lookup);
      const before = await measure(sqliteLookup);
      const sorted = [...times].sort((a, b) => a - b);
      const search = summarise(`lookup: typo'd number, ${size.toLocaleString('en')} parts`, sorted, { note: 'in-memory index' });
      if (size === largest) Object.assign(search, { target: 'p95 ≤ 25 ms', met: search.p95 <= 25 });
      figures.push(search);
      figures.push(summarise(`lookup through the SQLite FTS5 index, ${size.toLocaleString('en')} parts`, [...before.times].sort((a, b) => a - b), { note: 'the same queries; the index the in-memory one replaced' }));
      figures.push(single(`lookup: typo'd part in the top 3, ${size.toLocaleString('en')} parts`, '%', (100 * top3) / queryCount, { note: `${queryCount} queries (SQLite FTS5 index: ${((100 * before.top3) / queryCount).toFixed(1)} %)` }));
      const same = answers.filter((a, i) => a.join() === before.answers[i]!.join()).length;
      figures.push(single(`lookup: same top 10 as the SQLite FTS5 index, ${size.toLocaleString('en')} parts`, '%', (100 * same) / queryCount, { note: 'ids in the same order' }));

      const fuseCount = Math.min(options.fuseQueries ?? 100, queryCount);
      if (size === largest && fuseCount > 0) {
        const fuse = new Fuse(parts, { keys: ['number', 'key', 'description'], includeScore: true, ignoreLocation: true });
        const fuseTimes: number[] = [];
        let shared9 = 0;
        for (let i = 0; i < fuseCount; i++) {
          const start = performance.now();
          const top = fuse.search(queries[i]!.q, { limit: 10 }).map((r) => r.item.id);
          fuseTimes.push(performance.now() - start);
          const ours = new Set(answers[i]);
          if (top.filter((id) => ours.has(id)).length >= Math.min(9, top.length)) shared9++;
        }
        const fuseSorted = [...fuseTimes].sort((a, b) => a - b);
        const oursSame = [...times.slice(0, fuseCount)].sort((a, b) => a - b);
        const speedup = quantile(fuseSorted, 0.5) / quantile(oursSame, 0.5);
        figures.push(summarise(`plain fuse.js scan, ${size.toLocaleString('en')} parts`, fuseSorted, { note: `${fuseCount} queries; the baseline for the ratio below` }));
        figures.push(single('lookup speed ÷ plain fuse.js (same queries, medians)', '×', speedup, { target: '≥ 10×', met: speedup >= 10 }));
        const agreement = (100 * shared9) / fuseCount;
        figures.push(
          single('queries where 9 of the top 10 agree with plain fuse.js', '%', agreement, {
            target: '≥ 90 %',
            met: agreement >= 90,
            note: 'see docs/decisions/012: fuse ranks by its own score and breaks ties by catalogue order',
          }),
        );
      }
    } finally {
      await dataSource.destroy();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }
  return figures;
}
