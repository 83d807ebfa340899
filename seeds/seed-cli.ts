// `npm run seed` (and the start script): migrate after a backup, then seed the demo when the
// database has no users yet.
/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (entities, migrations, write lock); see docs/decisions/002-module-boundaries.md. */
import { EnvError, loadEnv } from '../apps/api/src/config/env';
import { createDataSource, databaseLocation } from '../apps/api/src/db/data-source';
import { migrateWithBackup } from '../apps/api/src/db/migrate';
import { demoPassword, demoSignIns, seedDemo } from './demo';

async function main(): Promise<void> {
  const env = loadEnv();
  const dataSource = createDataSource(databaseLocation(env));
  // Never print DATABASE_URL: it may carry a password.
  const where = env.databaseUrl ? 'the PostgreSQL database of DATABASE_URL' : env.databasePath;
  await dataSource.initialize();
  try {
    const migrated = await migrateWithBackup(dataSource, env.backupsDir);
    if (migrated.backupPath) console.log(`Backed up the database to ${migrated.backupPath} before migrating.`);
    if (migrated.applied.length) console.log(`Applied migrations: ${migrated.applied.join(', ')}`);
    if (await seedDemo(dataSource, new Date(), { uploadsDir: env.uploadsDir })) {
      console.log(`Seeded the demo into ${where}. Sign in with password "${demoPassword}" as:`);
      for (const s of demoSignIns) console.log(`  ${s.email.padEnd(32)} ${s.roles.join(', ')}`);
    } else {
      console.log(`${where} already has users; not seeding.`);
    }
  } finally {
    await dataSource.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof EnvError ? err.message : err);
  process.exit(1);
});
