/* eslint-disable @nx/enforce-module-boundaries -- the benchmark runs the API's own reorder service in this
   process, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// One generated shop and the reorder list over it, in a fresh process:
//   npx tsx tools/bench/reorder-child.ts <stocked parts> <runs>
// The shop (apps/api/src/modules/test-support/reorder-shop.ts) is written straight into SQLite after
// the migrations (prepared statements inside one db.write, far faster than the services), then the
// reorder-list service call is timed.
// Prints one JSON line: { parts, movements, generateSeconds, timesMs, suggestions }.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createDataSource, sqliteHandle } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createMemoryMailer } from '../../apps/api/src/lib/mailer';
import { createCatalogueService } from '../../apps/api/src/modules/catalogue/catalogue.service';
import { createOrdersService } from '../../apps/api/src/modules/purchasing/orders.service';
import { createReorderService } from '../../apps/api/src/modules/purchasing/reorder.service';
import { createSuppliersService } from '../../apps/api/src/modules/purchasing/suppliers.service';
import { generateReorderShop } from '../../apps/api/src/modules/test-support/reorder-shop';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { prng } from './harness';

/** The part of better-sqlite3's connection the generator uses (the package ships no types). */
interface RawSqlite {
  prepare(sql: string): { run(...params: unknown[]): unknown };
  exec(sql: string): unknown;
}

const partCount = Number(process.argv[2] ?? 50_000);
const runs = Number(process.argv[3] ?? 5);

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-reorder-bench-'));
const dataSource = createDataSource(path.join(dir, 'bench.sqlite'));
await dataSource.initialize();
await dataSource.runMigrations();
const db = databaseFor(dataSource);
try {
  const { shop } = await createShopWithUsers(db, systemClock, { roles: ['owner'], namePrefix: 'Reorder Bench' });
  const generateStart = performance.now();
  const movements = await db.write(async () => generateShop(sqliteHandle(dataSource) as unknown as RawSqlite, shop.id));
  const generateSeconds = (performance.now() - generateStart) / 1000;
  (sqliteHandle(dataSource) as unknown as RawSqlite).exec('ANALYZE');

  const catalogue = createCatalogueService({ db, clock: systemClock });
  const suppliers = createSuppliersService({ db, clock: systemClock });
  const orders = createOrdersService({ db, clock: systemClock, mailer: createMemoryMailer() });
  const reorder = createReorderService({ db, clock: systemClock, catalogue, suppliers, orders });
  const timesMs: number[] = [];
  let suggestions = 0;
  for (let i = 0; i <= runs; i++) {
    const t0 = performance.now();
    const list = await reorder.list(shop.id);
    // The first call also builds the catalogue's lineage graph (cached per catalogue version): timed apart.
    timesMs.push(performance.now() - t0);
    suggestions = list.suggestions.length;
  }
  console.log(JSON.stringify({ parts: partCount, movements, generateSeconds, firstMs: timesMs[0], timesMs: timesMs.slice(1), suggestions }));
} finally {
  await dataSource.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
}

/** Writes the generated shop through one prepared statement per table (each table's rows have the same columns). */
function generateShop(sql: RawSqlite, shopId: string): number {
  const statements = new Map<string, ReturnType<RawSqlite['prepare']>>();
  return generateReorderShop(
    (table, row) => {
      let statement = statements.get(table);
      if (!statement) {
        const columns = Object.keys(row);
        statements.set(table, (statement = sql.prepare(`INSERT INTO ${table} (${columns.join(', ')}) VALUES (${columns.map(() => '?').join(', ')})`)));
      }
      statement.run(...Object.values(row));
    },
    { shopId, partCount, now: Date.now(), rand: prng(partCount) },
  );
}
