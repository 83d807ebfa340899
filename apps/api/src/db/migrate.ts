import fs from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { isPostgres, sqliteHandle } from './data-source';

export interface MigrateResult {
  /** Names of the migrations that ran. */
  applied: string[];
  /** Where the database was copied before migrating; null when nothing needed a backup. */
  backupPath: string | null;
}

/**
 * Runs pending migrations. When the database already holds tables, it first takes an online
 * backup into `backupsDir` (reverting a migration can cascade-delete rows: platform-notes.md
 * traps 2 and 5). The data source must be initialised.
 */
export async function migrateWithBackup(dataSource: DataSource, backupsDir: string, now: Date = new Date()): Promise<MigrateResult> {
  if (isPostgres(dataSource)) {
    // PostgreSQL is backed up by its operator (pg_dump, base backups): decision 019.
    const ran = await dataSource.runMigrations({ transaction: 'each' });
    return { applied: ran.map((m) => m.name), backupPath: null };
  }
  // Counted first: showMigrations() itself creates the (empty) migrations table.
  const tables = (await dataSource.query(`SELECT count(*) AS n FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> 'migrations'`)) as Array<{ n: number }>;
  const pending = await dataSource.showMigrations();
  if (!pending) return { applied: [], backupPath: null };

  let backupPath: string | null = null;
  if ((tables[0]?.n ?? 0) > 0) {
    fs.mkdirSync(backupsDir, { recursive: true });
    const stamp = now.toISOString().replace(/[:.]/g, '-');
    backupPath = path.join(backupsDir, `tappet-${stamp}-before-migrate.sqlite`);
    await sqliteHandle(dataSource).backup(backupPath);
  }
  const ran = await dataSource.runMigrations({ transaction: 'each' });
  return { applied: ran.map((m) => m.name), backupPath };
}
