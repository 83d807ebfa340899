import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDataSource, sqliteHandle } from '../data-source';
import { localFileStore } from '../../modules/uploads/file-store';
import { BackupError, pidFileName, restoreBackup, runningInstance, takeBackup, type BackupManifest } from '../backup';
import { ShopEntity } from '../../modules/shops/shops.entity';
import { PartEntity } from '../../modules/catalogue/catalogue.entity';
import { createShopWithUsers } from '../../modules/test-support/test-support.service';
import { createBin, issueStock, receiveStock } from '../../modules/stock/stock.service';
import { checkLedger } from '../../modules/stock/stock.ledger-check';
import { systemClock } from '../../lib/clock';
import { openTestDatabase, onPostgres } from '../../test-support/test-app';

let database: Awaited<ReturnType<typeof openTestDatabase>>;
let work: string;
beforeEach(async () => {
  database = await openTestDatabase();
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-backup-test-'));
});
afterEach(async () => {
  await database.close();
  fs.rmSync(work, { recursive: true, force: true });
});

const databasePath = () => path.join(database.dir, 'tappet.sqlite');
const shopRow = () => ({ id: randomUUID(), name: 'Backup Test', slug: `b-${randomUUID()}`, billingState: 'trial' as const, createdAt: new Date() });

/** The ids of shops in a restored database file. */
async function shopIdsIn(file: string): Promise<Set<string>> {
  const ds = createDataSource(file);
  await ds.initialize();
  try {
    expect(sqliteHandle(ds).pragma('integrity_check', { simple: true })).toBe('ok');
    return new Set((await ds.getRepository(ShopEntity).find()).map((s) => s.id));
  } finally {
    await ds.destroy();
  }
}

/** The ids of stock movements in a restored database file, after its integrity and ledger checks. */
async function movementIdsIn(file: string): Promise<Set<string>> {
  const ds = createDataSource(file);
  await ds.initialize();
  try {
    expect(sqliteHandle(ds).pragma('integrity_check', { simple: true })).toBe('ok');
    // Every balance and valuation pool in the restored copy agrees with its ledger.
    expect(await checkLedger(ds.manager)).toEqual([]);
    return new Set(((await ds.query('SELECT id FROM stock_movements')) as { id: string }[]).map((r) => r.id));
  } finally {
    await ds.destroy();
  }
}

/** A shop with one bin and a part per writer, for writers that move stock. */
async function stockWorld(parts: number) {
  const { shop } = await createShopWithUsers(database.db, systemClock, { roles: ['owner'], namePrefix: 'Backup Stock' });
  const at = new Date();
  const partIds = Array.from({ length: parts }, () => randomUUID());
  const binId = await database.db.write(async (manager) => {
    await manager.insert(
      PartEntity,
      partIds.map((id, i) => ({ id, shopId: shop.id, number: `BK-${i}`, key: `BK${i}`, description: `Backup part ${i}`, origin: 'genuine' as const, maker: null, category: 'Engine', unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at })),
    );
    return (await createBin(manager, shop.id, { code: 'BK-BIN' }, { actor: { userId: null }, at })).id;
  });
  return { shopId: shop.id, partIds, binId };
}

const repo = path.resolve(import.meta.dirname, '../../../../..');

/** Runs `npm run backup`'s script on a data folder, in its own process. */
function runBackupCli(dataDir: string, backupsDir: string): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve) => {
    const child = spawn(path.join(repo, 'node_modules/.bin/tsx'), [path.join(repo, 'apps/api/src/db/backup-cli.ts'), backupsDir], {
      cwd: repo,
      env: { ...process.env, TAPPET_MODE: 'test', TAPPET_DATA_DIR: dataDir },
    });
    let output = '';
    child.stdout.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr.on('data', (d: Buffer) => (output += d.toString()));
    child.on('exit', (code) => resolve({ code, output }));
  });
}

// SQLite-specific by nature (decision 019): online backup is SQLite's (VACUUM INTO the file); PostgreSQL is backed up by its operator.
describe.skipIf(onPostgres())('online backup and restore', () => {
  it('takes a backup while stock keeps moving, and the restore holds every movement committed before it began', async () => {
    const uploads = path.join(database.dir, 'uploads', 'shop-a');
    fs.mkdirSync(uploads, { recursive: true });
    fs.writeFileSync(path.join(uploads, 'photo-1.jpg'), Buffer.alloc(2048, 7));
    const world = await stockWorld(4);

    const acknowledged: string[] = [];
    let stop = false;
    // Four writers, one per part, each committing movements one after another through the write
    // lock (two units in at a changing cost, one out), until told to stop. A movement counts as
    // committed once its write has returned.
    const writers = world.partIds.map(async (partId) => {
      for (let n = 0; !stop; n++) {
        const ctx = { actor: { userId: null }, at: new Date() };
        const moved = await database.db.write(async (manager) =>
          n % 3 === 2
            ? issueStock(manager, world.shopId, { partId, binId: world.binId, condition: 'new', quantity: 1 }, ctx)
            : receiveStock(manager, world.shopId, { partId, binId: world.binId, condition: 'new', quantity: 2, unitCostMinor: 1000 + n }, ctx),
        );
        acknowledged.push(...moved.map((m) => m.id));
        await new Promise((r) => setImmediate(r));
      }
    });
    while (acknowledged.length < 200) await new Promise((r) => setTimeout(r, 5));
    const before = [...acknowledged];
    // `npm run backup` in its own process, as an operator runs it beside the live app.
    const cli = await runBackupCli(database.dir, path.join(work, 'backups'));
    const during = acknowledged.length - before.length;
    stop = true;
    await Promise.all(writers);
    expect(cli.code, cli.output).toBe(0);
    const dir = /Backed up to (.+?): /.exec(cli.output)?.[1];
    expect(dir).toBeDefined();
    const manifest = JSON.parse(fs.readFileSync(path.join(dir!, 'manifest.json'), 'utf8')) as BackupManifest;
    // The writers kept committing while the other process took the backup.
    expect(during).toBeGreaterThan(0);

    expect(manifest.uploads).toEqual({ files: 1, bytes: 2048 });
    expect(manifest.database.migrations.length).toBeGreaterThan(0);

    const target = path.join(work, 'restored');
    const restored = restoreBackup({ backupDir: dir!, dataDir: target, databasePath: path.join(target, 'tappet.sqlite'), uploadsDir: path.join(target, 'uploads'), backupsDir: path.join(target, 'backups') });
    expect(restored.replacedDir).toBeNull();
    const ids = await movementIdsIn(path.join(target, 'tappet.sqlite'));
    // Every movement committed before the backup began is in the restored copy.
    expect(before.filter((id) => !ids.has(id))).toEqual([]);
    // A snapshot: it cannot hold everything written after it.
    expect(acknowledged.filter((id) => !ids.has(id)).length).toBeGreaterThan(0);
    expect(fs.readFileSync(path.join(target, 'uploads', 'shop-a', 'photo-1.jpg'))).toEqual(Buffer.alloc(2048, 7));
  });

  it('refuses to restore into a running instance, and refuses a damaged backup, changing nothing', async () => {
    await database.db.write((m) => m.insert(ShopEntity, shopRow()));
    const { dir } = await takeBackup({ databasePath: databasePath(), files: localFileStore(path.join(database.dir, 'uploads')), backupsDir: path.join(work, 'backups') });
    const target = path.join(work, 'live');
    fs.mkdirSync(target, { recursive: true });
    fs.writeFileSync(path.join(target, 'tappet.sqlite'), 'the live database');
    const options = { backupDir: dir, dataDir: target, databasePath: path.join(target, 'tappet.sqlite'), uploadsDir: path.join(target, 'uploads'), backupsDir: path.join(target, 'backups') };

    // This test process stands in for a running API.
    fs.writeFileSync(path.join(target, pidFileName), String(process.pid));
    expect(runningInstance(target)).toBe(process.pid);
    expect(() => restoreBackup(options)).toThrow(/running on this data folder/);
    // A pid file left by a process that has gone (a crash) does not block a restore.
    fs.writeFileSync(path.join(target, pidFileName), '2147483646');
    expect(runningInstance(target)).toBeNull();

    const damaged = path.join(work, 'damaged');
    fs.cpSync(dir, damaged, { recursive: true });
    const file = path.join(damaged, 'tappet.sqlite');
    const bytes = fs.readFileSync(file);
    bytes.fill(0xff, 4096, 12_288);
    fs.writeFileSync(file, bytes);
    expect(() => restoreBackup({ ...options, backupDir: damaged })).toThrow(BackupError);
    expect(() => restoreBackup({ ...options, backupDir: work })).toThrow(/not a Tappet backup/);
    expect(fs.readFileSync(path.join(target, 'tappet.sqlite'), 'utf8')).toBe('the live database');

    // A good backup replaces the database and keeps the old one aside.
    const { replacedDir } = restoreBackup(options);
    expect(fs.readFileSync(path.join(replacedDir!, 'tappet.sqlite'), 'utf8')).toBe('the live database');
    expect((await shopIdsIn(path.join(target, 'tappet.sqlite'))).size).toBeGreaterThan(0);
  });
});
