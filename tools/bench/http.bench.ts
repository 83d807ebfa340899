/* eslint-disable @nx/enforce-module-boundaries -- the benchmark prepares its database through the API's own
   data layer, as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// HTTP throughput (issue 14): the API runs in its own process on loopback (as `npm start` runs it,
// request logging on); autocannon loads it from this process. Figures: a trivial route (the ceiling
// on this machine), an authenticated shop read (what every shop route pays), authenticated lookups
// of typo'd numbers, and the same lookups while a 50,000-row catalogue import commits. Target: lookups ≥ 1,500 req/s with p99 ≤ 50 ms.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon, { type Result as LoadResult } from 'autocannon';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { databaseFor } from '../../apps/api/src/db/write-lock';
import { systemClock } from '../../apps/api/src/lib/clock';
import { createShopWithUsers } from '../../apps/api/src/modules/test-support/test-support.service';
import { generateParts, insertLinks, insertParts, partsCsv, pickWith, typo } from './catalogue-gen';
import { prng, single, type Figure } from './harness';

const repo = fileURLToPath(new URL('../..', import.meta.url));
// BENCH_HTTP_PORT lets helpers sharing a machine run it side by side.
const PORT = Number(process.env.BENCH_HTTP_PORT ?? 3970);
const base = `http://127.0.0.1:${PORT}`;
const CONNECTIONS = 10;
const SECONDS = 10;

/** CPU seconds (user + system) the process has used so far, from /proc (Linux). */
function cpuSeconds(pid: number): number {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100; // utime, stime in clock ticks (USER_HZ = 100)
}

async function waitForHealth(server: ChildProcess): Promise<void> {
  for (let i = 0; i < 240; i++) {
    // Exited (e.g. the port is taken): fail here rather than measure whatever answers on the port.
    if (server.exitCode !== null || server.signalCode !== null) throw new Error(`The API exited (${server.exitCode ?? server.signalCode}) before it answered: is the port in use?`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('The API did not start for the HTTP benchmark.');
}

export async function runHttpBench(partCount = 50_000): Promise<Figure[]> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-http-bench-'));
  const dataSource = createDataSource(path.join(dir, 'tappet.sqlite'));
  await dataSource.initialize();
  await dataSource.runMigrations();
  const db = databaseFor(dataSource);
  const created = await createShopWithUsers(db, systemClock, { roles: ['owner', 'mechanic'], namePrefix: 'HTTP Bench' });
  const shopId = created.shop.id;
  const parts = generateParts(partCount);
  await insertParts(db, shopId, parts);
  await insertLinks(db, shopId, parts, Math.round(partCount * 0.3));
  await dataSource.destroy();

  // BENCH_HTTP_NODE_ARGS (e.g. `--cpu-prof --cpu-prof-dir=/tmp/prof`) profiles the API process.
  const nodeArgs = (process.env.BENCH_HTTP_NODE_ARGS ?? '').split(' ').filter(Boolean);
  // A server left over from an interrupted run would answer instead of this one.
  if (await fetch(`${base}/api/health`).then(() => true, () => false)) throw new Error(`Something already answers on ${base}: stop it first.`);
  const server = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', path.join(repo, 'apps/api/src/main.ts')], {
    cwd: repo,
    env: { ...process.env, TAPPET_MODE: 'demo', PORT: String(PORT), PUBLIC_URL: base, TAPPET_DATA_DIR: dir, LOG_LEVEL: 'info' },
    stdio: 'ignore',
  });
  // Taken now, so that an early exit is not missed when the benchmark stops it.
  const exited = new Promise<void>((resolve) => server.once('exit', () => resolve()));
  try {
    await waitForHealth(server);
    const signIn = async (email: string) => {
      const res = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF': '1', Origin: base }, body: JSON.stringify({ email, password: created.password }) });
      if (!res.ok) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
      return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    };
    const byRole = (role: string) => created.users.find((u) => u.role === role)!.email;
    const mechanic = await signIn(byRole('mechanic'));
    const owner = await signIn(byRole('owner'));

    const rnd = prng(2024);
    const pick = pickWith(rnd);
    const queries = Array.from({ length: 2000 }, () => `/api/shops/${shopId}/parts/search?q=${encodeURIComponent(typo(pick(parts).number, rnd))}&limit=10`);
    let next = 0;
    const lookups = () =>
      autocannon({
        url: base,
        connections: CONNECTIONS,
        duration: SECONDS,
        headers: { cookie: mechanic },
        requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: queries[next++ % queries.length] }) }],
      });

    const figures: Figure[] = [];
    // The API's CPU time per answered request: steadier than throughput on a shared machine.
    const measure = async (load: () => Promise<LoadResult>) => {
      const before = cpuSeconds(server.pid!);
      const result = await load();
      return { result, cpuMsPerRequest: ((cpuSeconds(server.pid!) - before) * 1000) / Math.max(1, result.requests.total) };
    };
    const report = (name: string, measured: { result: LoadResult; cpuMsPerRequest: number }, target?: boolean, cpuWhat = 'per request') => {
      const r = measured.result;
      const failed = r.errors + r.timeouts + r.non2xx;
      const note = `${CONNECTIONS} connections, ${SECONDS} s; ${failed} failed of ${r.requests.total}; API process CPU ${measured.cpuMsPerRequest.toFixed(3)} ms ${cpuWhat}`;
      const okRate = target ? r.requests.average >= 1500 && failed === 0 : undefined;
      figures.push(single(`${name}: throughput`, 'req/s', r.requests.average, target ? { target: '≥ 1,500 req/s', met: okRate, note } : { note }));
      figures.push(single(`${name}: latency p99`, 'ms', r.latency.p99, target ? { target: 'p99 ≤ 50 ms', met: r.latency.p99 <= 50 } : {}));
    };

    await autocannon({ url: `${base}/api/health`, connections: CONNECTIONS, duration: 2 }); // warm-up
    report('HTTP: GET /api/health (ceiling)', await measure(() => autocannon({ url: `${base}/api/health`, connections: CONNECTIONS, duration: SECONDS })));
    // What every shop route pays before its own work: the session, the membership and the
    // member's permissions, the checks of the path. The shop's settings are one row to read.
    const floor = `${base}/api/shops/${shopId}/settings`;
    await autocannon({ url: floor, connections: CONNECTIONS, duration: 2, headers: { cookie: mechanic } }); // warm-up
    report('HTTP: authenticated shop read, GET settings (the floor under every shop route)', await measure(() => autocannon({ url: floor, connections: CONNECTIONS, duration: SECONDS, headers: { cookie: mechanic } })));
    // The shop's lookup index and lineage graph are built once per catalogue version: build them
    // before measuring, as the lookup benchmark does, so the figure is the steady state.
    const first = await fetch(`${base}${queries[0]}`, { headers: { cookie: mechanic } });
    if (!first.ok) throw new Error(`lookup failed: ${first.status}`);
    await autocannon({ url: base, connections: CONNECTIONS, duration: 2, headers: { cookie: mechanic }, requests: [{ method: 'GET', path: queries[0] }] }); // warm-up
    report(`HTTP: authenticated lookups, ${partCount.toLocaleString('en')} parts`, await measure(lookups), true);

    // BENCH_HTTP_SKIP_IMPORT=1 stops here (profiling the lookups alone).
    if (process.env.BENCH_HTTP_SKIP_IMPORT) return figures;
    // The same load while the owner's import of 50,000 new parts commits.
    const csv = partsCsv(generateParts(50_000, 777));
    const running = measure(lookups);
    await new Promise((r) => setTimeout(r, 1000));
    const form = new FormData();
    form.set('kind', 'parts');
    form.set('mode', 'commit');
    form.set('file', new Blob([csv], { type: 'text/csv' }), 'bench.csv');
    const importStart = performance.now();
    const imported = await fetch(`${base}/api/shops/${shopId}/imports`, { method: 'POST', headers: { cookie: owner, 'X-CSRF': '1', Origin: base }, body: form });
    const importSeconds = (performance.now() - importStart) / 1000;
    if (!imported.ok) throw new Error(`import during the load failed: ${imported.status} ${await imported.text()}`);
    report('HTTP: the same lookups while a 50,000-row import commits', await running, true, "per lookup, the import's own work included");
    figures.push(single('HTTP: the import itself under that load', 's', importSeconds, { note: 'upload, check and commit' }));
    return figures;
  } finally {
    server.kill('SIGTERM');
    await exited;
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
