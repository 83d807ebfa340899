/* eslint-disable @nx/enforce-module-boundaries -- the benchmark prepares its databases through the API's own
   data layer, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// Throughput with one and two API processes on PostgreSQL beside one on SQLite (issue 15), for
// docs/scaling.md. Run it through the throwaway-server wrapper, which sets TAPPET_TEST_PG_URL:
//
//   npm run bench:scaling
//
// Each set-up gets the same generated shop (parts and links), API processes started as `npm start`
// starts them (request logging on) and autocannon in this process on loopback: a trivial route,
// then authenticated lookups of typo'd numbers, then (when two processes run) the two loaded at
// once with half the connections each. These machines are shared and noisy, and autocannon shares
// their two cores with the API processes: compare the figures of one run with each other.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import pg from 'pg';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { generateParts, insertLinks, insertParts, pickWith, typo } from './catalogue-gen';
import { machineDescription, prng } from './harness';

const repo = fileURLToPath(new URL('../..', import.meta.url));
const PARTS = Number(process.env.SCALING_PARTS ?? 20_000);
const CONNECTIONS = 10;
const SECONDS = Number(process.env.SCALING_SECONDS ?? 10);
const firstPort = Number(process.env.SCALING_PORT ?? 3980);

interface Shop {
  shopId: string;
  mechanicEmail: string;
  password: string;
  queries: string[];
}

/** Migrates `location` (a file or a PostgreSQL URL) and fills one shop with generated parts and links. */
async function prepare(location: string): Promise<Shop> {
  const dataSource = createDataSource(location);
  await dataSource.initialize();
  await dataSource.runMigrations();
  const db = databaseFor(dataSource);
  const created = await createShopWithUsers(db, systemClock, { roles: ['mechanic'], namePrefix: 'Scaling Bench' });
  const parts = generateParts(PARTS);
  await insertParts(db, created.shop.id, parts);
  await insertLinks(db, created.shop.id, parts, Math.round(PARTS * 0.3));
  await dataSource.destroy();
  const rnd = prng(2026);
  const pick = pickWith(rnd);
  const queries = Array.from({ length: 2000 }, () => `/api/shops/${created.shop.id}/parts/search?q=${encodeURIComponent(typo(pick(parts).number, rnd))}&limit=10`);
  return { shopId: created.shop.id, mechanicEmail: created.users[0]!.email, password: created.password, queries };
}

/** Where a set-up keeps its data: the SQLite file's folder, or a PostgreSQL URL. */
type Target = { sqliteDir: string } | { databaseUrl: string };

async function startApi(port: number, target: Target): Promise<ChildProcess> {
  // On PostgreSQL each process gets a data folder of its own (pid file, backups); on SQLite the
  // folder is where the database file is.
  const dataDir = 'sqliteDir' in target ? target.sqliteDir : fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-scaling-api-'));
  const base = `http://127.0.0.1:${port}`;
  const { DATABASE_URL: _, ...inherited } = process.env;
  const child = spawn(path.join(repo, 'node_modules/.bin/tsx'), [path.join(repo, 'apps/api/src/main.ts')], {
    cwd: repo,
    env: { ...inherited, TAPPET_MODE: 'demo', PORT: String(port), PUBLIC_URL: base, TAPPET_DATA_DIR: dataDir, LOG_LEVEL: 'info', ...('databaseUrl' in target ? { DATABASE_URL: target.databaseUrl } : {}) },
    stdio: 'ignore',
  });
  if ('databaseUrl' in target) child.once('exit', () => fs.rmSync(dataDir, { recursive: true, force: true }));
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) return child;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  child.kill('SIGKILL');
  throw new Error(`The API on port ${port} did not start.`);
}

async function stopApi(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await exited;
}

async function signIn(port: number, shop: Shop): Promise<string> {
  const base = `http://127.0.0.1:${port}`;
  const res = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF': '1', Origin: base }, body: JSON.stringify({ email: shop.mechanicEmail, password: shop.password }) });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

interface Load {
  reqPerSec: number;
  p99: number;
  failed: number;
  total: number;
}

/** Lookups against every port at once, the connections split between them; figures summed. */
async function lookups(ports: number[], shop: Shop, cookie: string, seconds = SECONDS): Promise<Load> {
  let next = 0;
  const runs = await Promise.all(
    ports.map((port) =>
      autocannon({
        url: `http://127.0.0.1:${port}`,
        connections: CONNECTIONS / ports.length,
        duration: seconds,
        headers: { cookie },
        requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: shop.queries[next++ % shop.queries.length] }) }],
      }),
    ),
  );
  return {
    reqPerSec: runs.reduce((s, r) => s + r.requests.average, 0),
    p99: Math.max(...runs.map((r) => r.latency.p99)),
    failed: runs.reduce((s, r) => s + r.errors + r.timeouts + r.non2xx, 0),
    total: runs.reduce((s, r) => s + r.requests.total, 0),
  };
}

async function health(port: number): Promise<Load> {
  const r = await autocannon({ url: `http://127.0.0.1:${port}/api/health`, connections: CONNECTIONS, duration: SECONDS });
  return { reqPerSec: r.requests.average, p99: r.latency.p99, failed: r.errors + r.timeouts + r.non2xx, total: r.requests.total };
}

interface Row {
  setUp: string;
  trivial: Load;
  lookups: Load;
}

/** Starts `count` processes on `env`'s database, warms each (index and graph built), measures. */
async function measure(setUp: string, count: number, target: Target, shop: Shop): Promise<Row> {
  const ports = Array.from({ length: count }, (_, i) => firstPort + i);
  const children: ChildProcess[] = [];
  try {
    for (const port of ports) children.push(await startApi(port, target));
    // One session serves every process: sessions are rows in the shared database.
    const cookie = await signIn(ports[0]!, shop);
    for (const port of ports) await lookups([port], shop, cookie, 2); // each process builds its index
    const trivial = await health(ports[0]!);
    return { setUp, trivial, lookups: await lookups(ports, shop, cookie) };
  } finally {
    for (const child of children) await stopApi(child);
  }
}

async function main() {
  const loadAtStart = os.loadavg()[0]!;
  const adminUrl = process.env.TAPPET_TEST_PG_URL;
  if (!adminUrl) throw new Error('Run this through tools/scripts/postgres-for-tests.mjs (npm run bench:scaling): it needs TAPPET_TEST_PG_URL.');
  const rows: Row[] = [];

  const sqliteDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-scaling-sqlite-'));
  const pgName = `tappet_scaling_${randomUUID().replace(/-/g, '')}`;
  const admin = new pg.Client(adminUrl);
  await admin.connect();
  try {
    const file = path.join(sqliteDir, 'tappet.sqlite');
    const sqliteShop = await prepare(file);
    rows.push(await measure('SQLite, one process', 1, { sqliteDir }, sqliteShop));

    await admin.query(`CREATE DATABASE ${pgName}`);
    const url = new URL(adminUrl);
    url.pathname = `/${pgName}`;
    const pgShop = await prepare(url.toString());
    rows.push(await measure('PostgreSQL, one process', 1, { databaseUrl: url.toString() }, pgShop));
    rows.push(await measure('PostgreSQL, two processes', 2, { databaseUrl: url.toString() }, pgShop));
  } finally {
    await admin.query(`DROP DATABASE IF EXISTS ${pgName} WITH (FORCE)`).catch(() => undefined);
    await admin.end();
    fs.rmSync(sqliteDir, { recursive: true, force: true });
  }

  const fmt = (n: number) => Math.round(n).toLocaleString('en');
  const base = rows[0]!.lookups.reqPerSec;
  const table = [
    `Measured ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineDescription()} (load average ${loadAtStart.toFixed(1)} at the start), by \`npm run bench:scaling\`:`,
    `${PARTS.toLocaleString('en')} generated parts and ${Math.round(PARTS * 0.3).toLocaleString('en')} links in one shop, ${CONNECTIONS} connections for ${SECONDS} s (split between the`,
    'processes when there are two), autocannon on the same two cores as the API processes.',
    '',
    '| set-up | trivial route (ceiling) | authenticated lookups | lookups p99 | failed | lookups ÷ SQLite |',
    '| --- | ---: | ---: | ---: | ---: | ---: |',
    ...rows.map((r) => `| ${r.setUp} | ${fmt(r.trivial.reqPerSec)} req/s | ${fmt(r.lookups.reqPerSec)} req/s | ${fmt(r.lookups.p99)} ms | ${r.lookups.failed} of ${fmt(r.lookups.total)} | ${(r.lookups.reqPerSec / base).toFixed(2)} |`),
  ].join('\n');
  console.log(table);

  const doc = path.join(repo, 'docs/scaling.md');
  const text = fs.readFileSync(doc, 'utf8');
  const start = '<!-- scaling-bench:start -->';
  const end = '<!-- scaling-bench:end -->';
  const a = text.indexOf(start);
  const b = text.indexOf(end);
  if (a < 0 || b < a) throw new Error(`docs/scaling.md has no ${start} … ${end} section to rewrite.`);
  fs.writeFileSync(doc, `${text.slice(0, a + start.length)}\n${table}\n${text.slice(b)}`);
  console.log('docs/scaling.md updated.');
}

await main();
