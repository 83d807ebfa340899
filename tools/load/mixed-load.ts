/* eslint-disable @nx/enforce-module-boundaries -- the load run prepares and checks its database through the API's own
   data layer, as the benchmarks do (docs/decisions/002-module-boundaries.md). */
// `npm run load:mixed` (issue 13): the API in its own process on loopback, loaded for 60 s by
// autocannon with a mixed workload — lookups, resolves, holds, issues and receipts at once, and a
// 20,000-row catalogue import committing in the middle — then stopped, and the database checked:
// SQLite's integrity check, and every stock balance recomputed from the movement ledger. Writes
// the figures into docs/reliability.md. Bounded: 10 connections in all, loopback only.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon, { type Result as LoadResult } from 'autocannon';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { checkLedger } from '../../apps/api/src/modules/stock/stock.ledger-check';
import { generateParts, insertLinks, insertParts, partsCsv, pickWith, typo } from '../bench/catalogue-gen';
import { prng } from '../bench/harness';

const repo = fileURLToPath(new URL('../..', import.meta.url));
const PORT = Number(process.env['LOAD_PORT'] ?? 3975);
const base = `http://127.0.0.1:${PORT}`;
const SECONDS = Number(process.env['LOAD_SECONDS'] ?? 60);
const PARTS = 10_000;
const STOCKED = 200;
const withImport = process.env['LOAD_IMPORT'] !== '0';

interface Tally {
  name: string;
  connections: number;
  statuses: Map<number, number>;
  result?: LoadResult;
}

async function waitForHealth(): Promise<void> {
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('The API did not start for the load run.');
}

async function main(): Promise<void> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-load-'));
  const file = path.join(dir, 'tappet.sqlite');
  const setup = createDataSource(file);
  await setup.initialize();
  await setup.runMigrations();
  const created = await createShopWithUsers(databaseFor(setup), systemClock, { roles: ['owner'], namePrefix: 'Mixed Load' });
  const shopId = created.shop.id;
  const parts = generateParts(PARTS);
  await insertParts(databaseFor(setup), shopId, parts);
  await insertLinks(databaseFor(setup), shopId, parts, Math.round(PARTS * 0.3));
  const partIds = ((await setup.query('SELECT id FROM parts WHERE shop_id = ? ORDER BY number LIMIT ?', [shopId, STOCKED])) as { id: string }[]).map((r) => r.id);
  await setup.destroy();

  const server = spawn(path.join(repo, 'node_modules/.bin/tsx'), [path.join(repo, 'apps/api/src/main.ts')], {
    cwd: repo,
    env: { ...process.env, TAPPET_MODE: 'demo', PORT: String(PORT), PUBLIC_URL: base, TAPPET_DATA_DIR: dir, LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const tallies: Tally[] = [];
  let importSeconds = 0;
  let importStatus = 0;
  try {
    await waitForHealth();
    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF': '1', Origin: base }, body: JSON.stringify({ email: created.users[0]!.email, password: created.password }) });
    if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const write = { cookie, 'content-type': 'application/json', 'x-csrf': '1', origin: base };
    const post = async (url: string, body: unknown) => {
      const res = await fetch(`${base}/api/shops/${shopId}${url}`, { method: 'POST', headers: write, body: JSON.stringify(body) });
      if (!res.ok) throw new Error(`POST ${url}: ${res.status} ${await res.text()}`);
      return (await res.json()) as { id: string };
    };
    const bin = await post('/stock/bins', { code: 'LOAD-A1', description: 'Mixed load' });
    for (const partId of partIds) await post('/stock/receipts', { partId, binId: bin.id, condition: 'new', quantity: 40, unitCostMinor: 1250 });

    const rnd = prng(1313);
    const pick = pickWith(rnd);
    const line = () => ({ partId: partIds[Math.floor(rnd() * partIds.length)]!, binId: bin.id, condition: 'new' });
    const workloads: Array<{ name: string; connections: number; request: () => { method: 'GET' | 'POST'; path: string; body?: string } }> = [
      { name: 'lookups (typo’d numbers)', connections: 4, request: () => ({ method: 'GET', path: `/api/shops/${shopId}/parts/search?q=${encodeURIComponent(typo(pick(parts).number, rnd))}&limit=10` }) },
      { name: 'resolves', connections: 2, request: () => ({ method: 'GET', path: `/api/shops/${shopId}/lineage/resolve?number=${encodeURIComponent(pick(parts).number)}` }) },
      { name: 'holds', connections: 1, request: () => ({ method: 'POST', path: `/api/shops/${shopId}/stock/holds`, body: JSON.stringify({ ...line(), quantity: 1, purpose: 'Mixed load hold' }) }) },
      { name: 'issues', connections: 2, request: () => ({ method: 'POST', path: `/api/shops/${shopId}/stock/issues`, body: JSON.stringify({ ...line(), quantity: 1, reference: 'LOAD' }) }) },
      { name: 'receipts', connections: 1, request: () => ({ method: 'POST', path: `/api/shops/${shopId}/stock/receipts`, body: JSON.stringify({ ...line(), quantity: 3, unitCostMinor: 1000 + Math.floor(rnd() * 500) }) }) },
    ];
    const runs = workloads.map((w) => {
      const tally: Tally = { name: w.name, connections: w.connections, statuses: new Map() };
      tallies.push(tally);
      return autocannon({
        url: base,
        connections: w.connections,
        duration: SECONDS,
        headers: write,
        requests: [
          {
            setupRequest: (req) => ({ ...req, ...w.request() }),
            onResponse: (status) => tally.statuses.set(status, (tally.statuses.get(status) ?? 0) + 1),
          },
        ],
      }).then((result) => (tally.result = result));
    });

    // The import commits while everything else runs (LOAD_IMPORT=0 leaves it out, to compare).
    if (withImport) {
      await new Promise((r) => setTimeout(r, Math.min(10, SECONDS / 4) * 1000));
      const form = new FormData();
      form.set('kind', 'parts');
      form.set('mode', 'commit');
      form.set('file', new Blob([partsCsv(generateParts(20_000, 4242))], { type: 'text/csv' }), 'load.csv');
      const started = performance.now();
      const imported = await fetch(`${base}/api/shops/${shopId}/imports`, { method: 'POST', headers: { cookie, 'x-csrf': '1', origin: base }, body: form });
      importSeconds = (performance.now() - started) / 1000;
      importStatus = imported.status;
    }
    await Promise.all(runs);
  } finally {
    server.kill('SIGTERM');
    await new Promise((r) => server.once('exit', r));
  }

  const after = createDataSource(file);
  await after.initialize();
  const integrity = ((await after.query('PRAGMA integrity_check')) as { integrity_check: string }[])[0]?.integrity_check ?? 'no answer';
  const mismatches = await checkLedger(after.manager);
  const movements = ((await after.query('SELECT COUNT(*) AS n FROM stock_movements WHERE shop_id = ?', [shopId])) as { n: number }[])[0]?.n ?? 0;
  const importedParts = ((await after.query('SELECT COUNT(*) AS n FROM parts WHERE shop_id = ?', [shopId])) as { n: number }[])[0]?.n ?? 0;
  await after.destroy();
  fs.rmSync(dir, { recursive: true, force: true });

  const count = (t: Tally, test: (s: number) => boolean) => [...t.statuses].filter(([s]) => test(s)).reduce((n, [, c]) => n + c, 0);
  const serverErrors = tallies.reduce((n, t) => n + count(t, (s) => s >= 500) + (t.result?.errors ?? 0) + (t.result?.timeouts ?? 0), 0);
  const rows = tallies.map((t) => {
    const r = t.result!;
    const others = [...t.statuses].filter(([s]) => s >= 400 && s < 500).map(([s, c]) => `${c} × ${s}`).join(', ') || 'none';
    return `| ${t.name} | ${t.connections} | ${r.requests.total.toLocaleString('en')} | ${r.requests.average.toFixed(0)} | ${r.latency.p99} ms | ${count(t, (s) => s >= 200 && s < 300)} | ${others} | ${count(t, (s) => s >= 500) + r.errors + r.timeouts} |`;
  });
  const held = serverErrors === 0 && mismatches.length === 0 && integrity === 'ok' && (!withImport || (importStatus >= 200 && importStatus < 300));
  const section = [
    '<!-- mixed-load: written by `npm run load:mixed`; do not edit by hand -->',
    `## Mixed load: ${SECONDS} s`,
    '',
    `Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'CPU'}, Node ${process.version}; ${PARTS.toLocaleString('en')} parts, ${STOCKED} of them stocked in one bin; autocannon on loopback. Refusals are expected (a hold or an issue when the line has run out answers 409); what must not happen is a 5xx, an error or a timeout.`,
    '',
    '| workload | connections | requests | req/s | p99 | 2xx | 4xx | 5xx, errors, timeouts |',
    '| --- | ---: | ---: | ---: | ---: | ---: | --- | ---: |',
    ...rows,
    '',
    withImport
      ? `- A 20,000-row catalogue import committed during the run: HTTP ${importStatus} after ${importSeconds.toFixed(1)} s; the shop then held ${Number(importedParts).toLocaleString('en')} parts.`
      : '- No import in this run (LOAD_IMPORT=0).',
    `- Afterwards: \`PRAGMA integrity_check\` → ${integrity}; the ledger check over ${Number(movements).toLocaleString('en')} movements → ${mismatches.length === 0 ? 'every balance equals the sum of its movements' : `${mismatches.length} mismatches`}.`,
    `- Result: **${held ? 'held' : 'FAILED'}**.`,
    '<!-- /mixed-load -->',
  ].join('\n');
  const doc = path.join(repo, 'docs/reliability.md');
  const text = fs.readFileSync(doc, 'utf8');
  const start = text.indexOf('<!-- mixed-load:');
  const end = text.indexOf('<!-- /mixed-load -->');
  const marker = '<!-- results: written by `npm run reliability`; do not edit below -->';
  const next = start >= 0 && end > start ? text.slice(0, start) + section + text.slice(end + '<!-- /mixed-load -->'.length) : text.replace(marker, `${section}\n\n${marker}`);
  fs.writeFileSync(doc, next);
  console.log(section);
  if (!held) process.exitCode = 1;
}

await main();
