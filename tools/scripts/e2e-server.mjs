// The stack the browser tests run against: mail sink + API in test mode, on a fresh temp database.
// Test mode mounts the test-support routes that fixtures use to create their own shops.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const dataDir = mkdtempSync(join(tmpdir(), 'tappet-e2e-'));
const env = {
  ...process.env,
  TAPPET_MODE: 'test',
  PORT: process.env.E2E_PORT ?? '3100',
  TAPPET_DATA_DIR: dataDir,
  SMTP_HOST: '127.0.0.1',
  SMTP_PORT: process.env.E2E_SMTP_PORT ?? '1125',
  MAIL_SINK_HTTP_PORT: process.env.E2E_SINK_HTTP_PORT ?? '1180',
  LOG_LEVEL: 'warn',
  // The fake Stripe API sits 9000 above the app's port (tests compute the same).
  FAKE_STRIPE_PORT: String(Number(process.env.E2E_PORT ?? '3100') + 9000),
  FAKE_STRIPE_CATALOGUE: 'tools/fake-stripe/demo-catalogue.json',
  STRIPE_API_URL: `http://127.0.0.1:${Number(process.env.E2E_PORT ?? '3100') + 9000}`,
  STRIPE_WEBHOOK_URL: `http://127.0.0.1:${process.env.E2E_PORT ?? '3100'}/api/billing/webhook`,
};
const tsx = resolve('node_modules/.bin/tsx');

if (!existsSync('dist/apps/web/index.html')) {
  const b = spawnSync('npx', ['vite', 'build', '-c', 'apps/web/vite.config.ts', '--logLevel', 'warn'], { stdio: 'inherit', env });
  if (b.status !== 0) process.exit(1);
}
const seed = spawnSync(tsx, ['seeds/seed-cli.ts'], { stdio: 'inherit', env });
if (seed.status !== 0) process.exit(1);

const children = [
  spawn(tsx, ['tools/mail-sink/cli.ts'], { stdio: 'inherit', env }),
  spawn(tsx, ['tools/fake-stripe/cli.ts'], { stdio: 'inherit', env }),
  spawn(tsx, ['apps/api/src/main.ts'], { stdio: 'inherit', env }),
];
console.log(`Fake Stripe for the browser tests: ${env.STRIPE_API_URL}`);
let stopping = false;
const stop = () => {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill('SIGTERM');
  setTimeout(() => {
    rmSync(dataDir, { recursive: true, force: true });
    process.exit(0);
  }, 1000);
};
for (const c of children) c.on('exit', () => stop());
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
