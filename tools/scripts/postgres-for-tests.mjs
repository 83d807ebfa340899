// A throwaway PostgreSQL server for tests (issue 15): Debian's `postgresql` package, installed
// when missing (as ensure-chromium.mjs does for Chromium), a cluster made with initdb in a temp
// folder, listening on 127.0.0.1 only, run as the `postgres` system user (PostgreSQL refuses to run
// as root), and removed afterwards.
//
//   node tools/scripts/postgres-for-tests.mjs <command…>   runs the command with TAPPET_TEST_DB=postgres
//                                                          and TAPPET_TEST_PG_URL set, then stops the server.
import { execFileSync, spawn } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

/** The newest installed server's bin folder (Debian keeps them under /usr/lib/postgresql/<major>/bin). */
function serverBin() {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  const majors = readdirSync(root).filter((d) => existsSync(path.join(root, d, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a));
  return majors.length ? path.join(root, majors[0], 'bin') : null;
}

export function ensurePostgres() {
  const bin = serverBin();
  if (bin) return bin;
  if (!isRoot) {
    console.error('PostgreSQL is missing and cannot be installed automatically here.\nInstall Debian\'s package as root:  apt-get update && apt-get install -y postgresql');
    process.exit(1);
  }
  console.log('PostgreSQL is missing: installing Debian\'s "postgresql" package (apt-get)…');
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'postgresql'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  const installed = serverBin();
  if (!installed) {
    console.error('apt-get finished but no PostgreSQL server was found under /usr/lib/postgresql.');
    process.exit(1);
  }
  return installed;
}

/** Resolves to `preferred` when it is free on 127.0.0.1, else to a port the system picks. */
function freePort(preferred) {
  const tryPort = (port) =>
    new Promise((resolve) => {
      const server = net.createServer();
      server.once('error', () => resolve(null));
      server.listen(port, '127.0.0.1', () => {
        const chosen = server.address().port;
        server.close(() => resolve(chosen));
      });
    });
  return tryPort(preferred).then((port) => port ?? tryPort(0));
}

/** Runs a server binary as the `postgres` user when we are root (PostgreSQL refuses root), else as ourselves. */
function asServerUser(bin, file, args) {
  const command = path.join(bin, file);
  if (isRoot) return execFileSync('runuser', ['-u', 'postgres', '--', command, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
  return execFileSync(command, args, { stdio: ['ignore', 'pipe', 'pipe'] });
}

/** Starts a fresh cluster; resolves to its superuser URL and a stop() that removes everything. */
export async function startTestPostgres({ preferredPort = 55432 } = {}) {
  const bin = ensurePostgres();
  const dir = mkdtempSync(path.join(os.tmpdir(), 'tappet-pg-'));
  chmodSync(dir, 0o777); // the postgres user writes the cluster and its socket here
  const data = path.join(dir, 'data');
  if (isRoot) execFileSync('runuser', ['-u', 'postgres', '--', 'mkdir', '-m', '700', data]);
  // C collation: text sorts by bytes, as SQLite's BINARY does. Trust auth: loopback only, thrown away after.
  asServerUser(bin, 'initdb', ['-D', data, '-U', 'postgres', '--auth=trust', '--encoding=UTF8', '--locale=C', '--no-sync']);
  const port = await freePort(preferredPort);
  // fsync off: nothing here needs to survive a power cut, and the suite runs much faster without it.
  const options = `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=300`;
  asServerUser(bin, 'pg_ctl', ['-D', data, '-l', path.join(dir, 'server.log'), '-o', options, '-w', 'start']);
  let stopped = false;
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    dir,
    stop() {
      if (stopped) return;
      stopped = true;
      try {
        asServerUser(bin, 'pg_ctl', ['-D', data, '-m', 'fast', '-w', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const [command, ...args] = process.argv.slice(2);
  if (!command) {
    console.error('Usage: node tools/scripts/postgres-for-tests.mjs <command> [args…]');
    process.exit(2);
  }
  const server = await startTestPostgres();
  console.log(`PostgreSQL for tests at ${server.url}`);
  const child = spawn(command, args, { stdio: 'inherit', env: { ...process.env, TAPPET_TEST_DB: 'postgres', TAPPET_TEST_PG_URL: server.url } });
  const stop = () => server.stop();
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
  child.on('exit', (code, signal) => {
    stop();
    process.exit(code ?? (signal ? 1 : 0));
  });
}
