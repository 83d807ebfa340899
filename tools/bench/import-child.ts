/* eslint-disable @nx/enforce-module-boundaries -- the benchmark runs the API's own import service in this
   process, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// One catalogue import in a fresh process, so its peak memory is its own:
//   npx tsx tools/bench/import-child.ts <rows>
// Prints one JSON line: { rows, seconds, maxRssMB, added }.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createCatalogueService } from '../../apps/api/src/modules/catalogue/catalogue.service';
import { createImportService } from '../../apps/api/src/modules/catalogue/imports/import.service';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { generateParts, partsCsv } from './catalogue-gen';

const rows = Number(process.argv[2] ?? 100_000);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-import-bench-'));
const dataSource = createDataSource(path.join(dir, 'bench.sqlite'));
await dataSource.initialize();
await dataSource.runMigrations();
const db = databaseFor(dataSource);
try {
  const created = await createShopWithUsers(db, systemClock, { roles: ['owner'], namePrefix: 'Import Bench' });
  const file = Buffer.from(partsCsv(generateParts(rows, 4242)));
  const imports = createImportService({ db, clock: systemClock, catalogue: createCatalogueService({ db, clock: systemClock }) });
  const start = performance.now();
  const result = await imports.run(created.shop.id, { kind: 'parts', mode: 'commit', file, fileName: 'bench.csv' }, { userId: created.users[0]!.id });
  const seconds = (performance.now() - start) / 1000;
  if (result.errors.length > 0) throw new Error(`The import refused the file: ${JSON.stringify(result.errors.slice(0, 3))}`);
  // ru_maxrss is in kilobytes on Linux.
  console.log(JSON.stringify({ rows, seconds, maxRssMB: process.resourceUsage().maxRSS / 1024, added: result.added, fileMB: file.length / 2 ** 20 }));
} finally {
  await dataSource.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
}
