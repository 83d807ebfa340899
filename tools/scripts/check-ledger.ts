// `npm run check:ledger`: recomputes every cached stock balance (line quantities, held quantities,
// pool quantities and values, serialised items) from the append-only movement ledger and exits
// non-zero when any disagrees. Reads the database of the environment (TAPPET_DATA_DIR, default
// ./data); it never writes.
/* eslint-disable @nx/enforce-module-boundaries -- the check reads through the API's own data layer
   (data source, ledger check); see docs/decisions/002-module-boundaries.md. */
import fs from 'node:fs';
import { EnvError, loadEnv } from '../../apps/api/src/config/env';
import { createDataSource, databaseLocation } from '../../apps/api/src/db/data-source';
import { checkLedger } from '../../apps/api/src/modules/stock/stock.ledger-check';

async function main(): Promise<number> {
  const env = loadEnv();
  if (!env.databaseUrl && !fs.existsSync(env.databasePath)) {
    console.error(`No database at ${env.databasePath}.`);
    return 2;
  }
  const dataSource = createDataSource(databaseLocation(env));
  await dataSource.initialize();
  try {
    const mismatches = await checkLedger(dataSource.manager);
    if (mismatches.length === 0) {
      const [row] = await dataSource.manager.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n FROM stock_movements`);
      console.log(`Ledger OK: every balance agrees with ${Number(row?.n ?? 0)} movements.`);
      return 0;
    }
    console.error(`Ledger check failed: ${mismatches.length} balance(s) disagree with the ledger.`);
    for (const m of mismatches) console.error(`  shop ${m.shopId} ${m.kind} ${m.subject}: ledger says ${m.expected}, stored ${m.actual}`);
    return 1;
  } finally {
    await dataSource.destroy();
  }
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err instanceof EnvError ? err.message : err);
    process.exit(2);
  },
);
