import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { onPostgres } from '../../test-support/test-app';
import type { DataSource } from 'typeorm';
import { createDataSource, migrations, sqliteHandle } from '../data-source';
import { migrateWithBackup } from '../migrate';

const open: DataSource[] = [];
const dirs: string[] = [];
afterEach(async () => {
  for (const ds of open.splice(0)) if (ds.isInitialized) await ds.destroy();
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});

async function freshDataSource() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-migrate-'));
  dirs.push(dir);
  const ds = createDataSource(path.join(dir, 'tappet.sqlite'));
  open.push(ds);
  await ds.initialize();
  return { ds, dir };
}

// SQLite-specific by nature (decision 019): checks SQLite pragmas and the file backup taken before migrating.
describe.skipIf(onPostgres())('migrateWithBackup', () => {
  it('migrates a new database without a backup, and sets the pragmas', async () => {
    const { ds, dir } = await freshDataSource();
    const result = await migrateWithBackup(ds, path.join(dir, 'backups'));
    expect(result).toEqual({ applied: migrations.map((m) => m.name), backupPath: null });
    const db = sqliteHandle(ds);
    expect(db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(db.pragma('synchronous', { simple: true })).toBe(1); // NORMAL
    expect(db.pragma('foreign_keys', { simple: true })).toBe(1);
    expect(db.pragma('busy_timeout', { simple: true })).toBe(5000);
    expect(db.pragma('temp_store', { simple: true })).toBe(2); // MEMORY
  });

  it('does nothing when no migration is pending', async () => {
    const { ds, dir } = await freshDataSource();
    await migrateWithBackup(ds, path.join(dir, 'backups'));
    expect(await migrateWithBackup(ds, path.join(dir, 'backups'))).toEqual({ applied: [], backupPath: null });
  });

  it('backs up an existing database before running pending migrations', async () => {
    const { ds, dir } = await freshDataSource();
    // A database with data in it from before (here: a table the migrations do not know).
    await ds.query(`CREATE TABLE older_data (note text)`);
    await ds.query(`INSERT INTO older_data (note) VALUES ('keep me')`);
    const result = await migrateWithBackup(ds, path.join(dir, 'backups'), new Date(Date.UTC(2026, 0, 2, 3, 4, 5)));
    expect(result.applied).toEqual(migrations.map((m) => m.name));
    expect(result.backupPath).toBe(path.join(dir, 'backups', 'tappet-2026-01-02T03-04-05-000Z-before-migrate.sqlite'));
    const backup = createDataSource(result.backupPath!);
    open.push(backup);
    await backup.initialize();
    expect(await backup.query(`SELECT note FROM older_data`)).toEqual([{ note: 'keep me' }]);
    // The backup is from before: none of the migrated tables are in it.
    expect(await backup.query(`SELECT name FROM sqlite_master WHERE name = 'users'`)).toEqual([]);
  });
});
