import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sqliteHandle } from '../../../db/data-source';
import { onPostgres } from '../../../test-support/test-app';
import { stockWorld, type StockWorld } from './helpers';

const run = promisify(execFile);
const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../../../..');
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-check-ledger-'));

/** Copies the test database (WAL folded in) to where the script looks, runs it, returns exit code and output. */
async function checkLedgerScript(w: StockWorld): Promise<{ code: number; out: string }> {
  sqliteHandle(w.ctx.db.dataSource).pragma('wal_checkpoint(TRUNCATE)');
  const source = (w.ctx.db.dataSource.options as { database: string }).database;
  fs.copyFileSync(source, path.join(dataDir, 'tappet.sqlite'));
  try {
    const { stdout, stderr } = await run(process.execPath, ['--import', 'tsx', 'tools/scripts/check-ledger.ts'], { cwd: repoRoot, env: { ...process.env, TAPPET_DATA_DIR: dataDir, TAPPET_MODE: 'test', NODE_ENV: 'test' } });
    return { code: 0, out: stdout + stderr };
  } catch (error) {
    const e = error as { code: number; stdout: string; stderr: string };
    return { code: e.code, out: e.stdout + e.stderr };
  }
}

let w: StockWorld;
beforeAll(async () => {
  w = await stockWorld();
});
afterAll(async () => {
  await w.ctx.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

// SQLite-specific by nature (decision 019): hands the script a copy of the SQLite file.
describe.skipIf(onPostgres())('npm run check:ledger', () => {
  it('exits 0 when every balance agrees with the ledger, and 1 naming the balance after one is corrupted', async () => {
    const part = await w.addPart('CK-100');
    const bin = await w.addBin('CK-1');
    await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 9, unitCostMinor: 410 });
    await w.post('mechanic', '/issues', { partId: part, binId: bin, condition: 'new', quantity: 2 });
    const clean = await checkLedgerScript(w);
    expect(clean.out).toMatch(/Ledger OK: every balance agrees with 2 movements/);
    expect(clean.code).toBe(0);

    // A balance written behind the ledger's back: 7 on hand becomes 8.
    await w.ctx.db.write((m) => m.query(`UPDATE stock_lines SET on_hand = 8 WHERE shop_id = ? AND part_id = ?`, [w.shopId, part]));
    const corrupted = await checkLedgerScript(w);
    expect(corrupted.code).toBe(1);
    expect(corrupted.out).toContain(`line part ${part}/bin ${bin}/new: ledger says 7, stored 8`);
  }, 60_000);
});
