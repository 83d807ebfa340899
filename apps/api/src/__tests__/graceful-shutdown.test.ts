import { spawn } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDataSource, sqliteHandle } from '../db/data-source';
import { pidFileName } from '../db/backup';

// SIGTERM (issue 13): the API stops taking new connections, answers the request in flight, lets
// queued writes commit, closes the database cleanly and removes its pid file.

const repo = path.resolve(import.meta.dirname, '../../../..');
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-shutdown-'));
const port = 4300 + Math.floor(Math.random() * 600);
const base = `http://127.0.0.1:${port}`;
afterAll(() => fs.rmSync(dataDir, { recursive: true, force: true }));

async function waitForHealth(): Promise<void> {
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('the API did not start');
}

describe('SIGTERM', () => {
  it('finishes the request in flight, commits it, closes the database cleanly and exits 0', { timeout: 120_000 }, async () => {
    const server = spawn(process.execPath, ['--import', 'tsx', path.join(repo, 'apps/api/src/main.ts')], {
      cwd: repo,
      env: { ...process.env, TAPPET_MODE: 'test', PORT: String(port), PUBLIC_URL: base, TAPPET_DATA_DIR: dataDir, LOG_LEVEL: 'warn' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let log = '';
    server.stdout.on('data', (d: Buffer) => (log += d.toString()));
    server.stderr.on('data', (d: Buffer) => (log += d.toString()));
    const exited = new Promise<number | null>((resolve) => server.on('exit', (code) => resolve(code)));
    await waitForHealth();
    expect(fs.readFileSync(path.join(dataDir, pidFileName), 'utf8').trim()).toBe(String(server.pid));

    const headers = { 'Content-Type': 'application/json', 'X-CSRF': '1', Origin: base };
    const shop = (await (await fetch(`${base}/api/test-support/shops`, { method: 'POST', headers, body: JSON.stringify({ roles: ['owner'] }) })).json()) as { shop: { id: string }; users: Array<{ email: string }>; password: string };
    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers, body: JSON.stringify({ email: shop.users[0]!.email, password: shop.password }) });
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

    // A request whose body is still arriving when SIGTERM comes.
    const body = JSON.stringify({ number: 'ST-0001', description: 'Sent across a shutdown' });
    const answer = new Promise<{ status: number; text: string }>((resolve, reject) => {
      const req = http.request(`${base}/api/shops/${shop.shop.id}/parts`, { method: 'POST', headers: { ...headers, cookie, 'Content-Length': Buffer.byteLength(body) } }, (res) => {
        let text = '';
        res.on('data', (d: Buffer) => (text += d.toString()));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, text }));
      });
      req.on('error', reject);
      req.write(body.slice(0, 10));
      setTimeout(() => {
        server.kill('SIGTERM');
        setTimeout(() => req.end(body.slice(10)), 500);
      }, 200);
    });
    const res = await answer;
    expect(res.status, res.text).toBe(201);
    // No new connections once stopping.
    await expect(fetch(`${base}/api/health`)).rejects.toThrow();
    expect(await exited, log).toBe(0);
    expect(fs.existsSync(path.join(dataDir, pidFileName))).toBe(false);

    // Closed cleanly: the write-ahead log was checkpointed into the database and removed.
    expect(fs.existsSync(path.join(dataDir, 'tappet.sqlite-wal'))).toBe(false);
    const ds = createDataSource(path.join(dataDir, 'tappet.sqlite'));
    await ds.initialize();
    try {
      expect(sqliteHandle(ds).pragma('integrity_check', { simple: true })).toBe('ok');
      expect(await ds.query('SELECT number FROM parts WHERE shop_id = ?', [shop.shop.id])).toEqual([{ number: 'ST-0001' }]);
    } finally {
      await ds.destroy();
    }
  });
});
