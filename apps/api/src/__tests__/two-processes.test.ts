// Two API processes on different ports sharing one PostgreSQL database (issue 15): a session made
// on one works on the other, and holds on the last units fired at both never oversell. Runs only
// on PostgreSQL (`npm run test:api:pg`); on SQLite one process owns the file.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { systemClock } from '../lib/clock';
import { createShopWithUsers } from '../modules/test-support/test-support.service';
import { onPostgres, openTestDatabase } from '../test-support/test-app';

const root = path.resolve(__dirname, '../../../..');
// The brief's port base for this branch's processes.
const ports = [4001, 4002];

let database: Awaited<ReturnType<typeof openTestDatabase>>;
const children: ChildProcess[] = [];

async function startApi(port: number, databaseUrl: string): Promise<string> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'apps/api/src/main.ts'], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: databaseUrl, PORT: String(port), TAPPET_MODE: 'test', TAPPET_DATA_DIR: path.join(database.dir, `api-${port}`), LOG_LEVEL: 'silent' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  let output = '';
  child.stdout!.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (output += d.toString()));
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 600; i++) {
    if (child.exitCode !== null) throw new Error(`API on ${port} stopped: ${output}`);
    const up = await fetch(`${base}/api/health`).then((r) => r.ok, () => false);
    if (up) return base;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`API on ${port} did not start: ${output}`);
}

describe.skipIf(!onPostgres())('two API processes on one PostgreSQL database', () => {
  let bases: string[] = [];
  let shopId = '';
  const cookies: Record<string, string> = {};

  const call = (base: string, method: string, url: string, body?: unknown, as = 'owner') =>
    fetch(`${base}/api/shops/${shopId}${url}`, {
      method,
      headers: { cookie: cookies[as]!, 'content-type': 'application/json', 'x-csrf': '1' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });

  beforeAll(async () => {
    database = await openTestDatabase();
    // The processes run on the real clock, so the shop's trial must start now.
    const shop = await createShopWithUsers(database.db, systemClock, { roles: ['owner', 'buyer'] });
    shopId = shop.shop.id;
    const url = String((database.dataSource.options as { url?: string }).url);
    bases = await Promise.all(ports.map((p) => startApi(p, url)));
    // Every session is made on the first process.
    for (const user of shop.users) {
      const signIn = await fetch(`${bases[0]}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf': '1' }, body: JSON.stringify({ email: user.email, password: shop.password }) });
      expect(signIn.status).toBe(200);
      cookies[user.role] = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    }
  }, 120_000);

  afterAll(async () => {
    for (const child of children) child.kill('SIGTERM');
    await Promise.all(children.map((c) => (c.exitCode !== null ? undefined : new Promise((r) => c.once('exit', r)))));
    await database?.close();
  });

  it('accepts on the second process a session made on the first', async () => {
    expect((await call(bases[1]!, 'GET', '/stock/holds')).status).toBe(200);
    expect((await fetch(`${bases[1]}/api/shops/${shopId}/stock/holds`)).status).toBe(401);
  });

  it('lets exactly the free units be held when holds are fired at both processes at once', async () => {
    const partRes = await call(bases[0]!, 'POST', '/parts', { number: 'TP-100', description: 'Part TP-100' });
    const binRes = await call(bases[1]!, 'POST', '/stock/bins', { code: 'TP-1', description: 'Bin TP-1' });
    expect([partRes.status, binRes.status], await partRes.clone().text()).toEqual([201, 201]);
    const [part, bin] = [await partRes.json(), await binRes.json()];
    const line = { partId: part.id, binId: bin.id, condition: 'new' };
    expect((await call(bases[0]!, 'POST', '/stock/receipts', { ...line, quantity: 5, unitCostMinor: 250 }, 'buyer')).status).toBe(201);

    const results = await Promise.all(Array.from({ length: 16 }, (_, i) => call(bases[i % 2]!, 'POST', '/stock/holds', { ...line, quantity: 1, purpose: `Job ${i}` })));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(5);
    expect(statuses.filter((s) => s === 409)).toHaveLength(11);
    const stock = await (await call(bases[1]!, 'GET', `/stock/parts/${part.id}`)).json();
    expect(stock.stock).toMatchObject({ onHand: 5, held: 5, free: 0 });
  }, 60_000);
});
