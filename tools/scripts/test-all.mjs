// `npm test`: every check, in order, stopping at the first failure.
// Lint and type-check first (fast, catch most mistakes), then unit and API tests, then the
// browser tests against a freshly built web app, then the API tests once more on PostgreSQL.
import { spawnSync } from 'node:child_process';
import { ensureChromium } from './ensure-chromium.mjs';

const steps = [
  // The Nx boundary rule silently skips without a project graph, so build the graph first.
  ['project graph', 'npx', ['nx', 'show', 'projects']],
  ['lint', 'npx', ['eslint', '.', '--max-warnings=0']],
  ['type-check', 'npx', ['tsc', '-p', 'tsconfig.typecheck.json', '--noEmit']],
  ['unit and API tests', 'npx', ['vitest', 'run']],
  ['web build', 'npx', ['vite', 'build', '-c', 'apps/web/vite.config.ts', '--logLevel', 'warn']],
  ['web bundle budget', 'node', ['tools/scripts/check-bundle-size.mjs']],
  ['browser tests', 'npx', ['playwright', 'test', '-c', 'apps/e2e/playwright.config.ts']],
  // The API suite again on a throwaway PostgreSQL (issue 15; installed with apt-get when missing).
  ['API tests on PostgreSQL', 'node', ['tools/scripts/postgres-for-tests.mjs', 'npx', 'vitest', 'run', '--project', 'api']],
];

const env = { ...process.env, NX_DAEMON: 'false', NX_NO_CLOUD: 'true' };
const started = Date.now();
for (const [name, cmd, args] of steps) {
  if (name === 'browser tests') ensureChromium();
  const t0 = Date.now();
  console.log(`\n=== ${name}: ${cmd} ${args.join(' ')}`);
  const r = spawnSync(cmd, args, { stdio: 'inherit', env });
  const secs = ((Date.now() - t0) / 1000).toFixed(0);
  if (r.status !== 0) {
    console.error(`\n✗ ${name} failed after ${secs} s (exit ${r.status ?? r.signal}).`);
    process.exit(r.status || 1);
  }
  console.log(`✓ ${name} passed in ${secs} s`);
}
console.log(`\nAll checks passed in ${((Date.now() - started) / 1000).toFixed(0)} s.`);
