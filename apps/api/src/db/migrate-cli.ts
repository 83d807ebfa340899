// `npm run migrate`: runs pending migrations on the configured database, after a backup.
import { loadEnv, EnvError } from '../config/env';
import { createDataSource, databaseLocation } from './data-source';
import { migrateWithBackup } from './migrate';

async function main(): Promise<void> {
  const env = loadEnv();
  const dataSource = createDataSource(databaseLocation(env));
  await dataSource.initialize();
  try {
    const result = await migrateWithBackup(dataSource, env.backupsDir);
    if (result.backupPath) console.log(`Backed up the database to ${result.backupPath}`);
    console.log(result.applied.length ? `Applied: ${result.applied.join(', ')}` : 'No pending migrations.');
  } finally {
    await dataSource.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof EnvError ? err.message : err);
  process.exit(1);
});
