// `npm start`: the whole product on this machine, with its demo data and local fakes.
// Builds the web app, starts the local mail sink, migrates (after a backup) and seeds the demo
// scenario into an empty database, then starts the API, which also serves the web app.
import { spawn, spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';

const port = process.env.PORT ?? '3000';
const dataDir = resolve(process.env.TAPPET_DATA_DIR ?? './data');
const smtpPort = process.env.SMTP_PORT ?? '1025';
const sinkHttpPort = process.env.MAIL_SINK_HTTP_PORT ?? '1080';
const stripePort = process.env.FAKE_STRIPE_PORT ?? '12111';
mkdirSync(dataDir, { recursive: true });

const env = {
  ...process.env,
  TAPPET_MODE: process.env.TAPPET_MODE ?? 'demo',
  PORT: port,
  TAPPET_DATA_DIR: dataDir,
  SMTP_HOST: process.env.SMTP_HOST ?? '127.0.0.1',
  SMTP_PORT: smtpPort,
  MAIL_SINK_HTTP_PORT: sinkHttpPort,
  // The API's Stripe SDK talks to the local fake; the fake sends its signed webhooks back to the API.
  FAKE_STRIPE_PORT: stripePort,
  FAKE_STRIPE_CATALOGUE: process.env.FAKE_STRIPE_CATALOGUE ?? 'tools/fake-stripe/demo-catalogue.json',
  STRIPE_API_URL: process.env.STRIPE_API_URL ?? `http://127.0.0.1:${stripePort}`,
  STRIPE_WEBHOOK_URL: process.env.STRIPE_WEBHOOK_URL ?? `http://127.0.0.1:${port}/api/billing/webhook`,
};
if (env.TAPPET_MODE === 'production' || env.NODE_ENV === 'production') {
  console.error('npm start runs the local demo. In production run the API directly (see DEVELOPERS.md).');
  process.exit(1);
}

const tsx = resolve('node_modules/.bin/tsx');
const children = [];

function run(label, cmd, args) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', env });
  if (r.status !== 0) {
    console.error(`✗ ${label} failed (exit ${r.status ?? r.signal}).`);
    shutdown(1);
  }
}

function start(label, cmd, args) {
  const child = spawn(cmd, args, { stdio: 'inherit', env });
  child.on('exit', (code, signal) => {
    if (!stopping) {
      console.error(`✗ ${label} stopped (${code ?? signal}); stopping the rest.`);
      shutdown(code || 1);
    }
  });
  children.push(child);
  return child;
}

let stopping = false;
function shutdown(code = 0) {
  stopping = true;
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  setTimeout(() => process.exit(code), 500).unref();
  if (children.every((c) => c.exitCode !== null)) process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

console.log('Building the web app…');
run('web build', 'npx', ['vite', 'build', '-c', 'apps/web/vite.config.ts', '--logLevel', 'warn']);

start('mail sink', tsx, ['tools/mail-sink/cli.ts']);
start('fake Stripe', tsx, ['tools/fake-stripe/cli.ts']);
console.log('Migrating and seeding the demo database…');
run('migrate and seed', tsx, ['seeds/seed-cli.ts']);
const api = start('API', tsx, ['apps/api/src/main.ts']);

// Print the sign-ins once the API answers.
const base = `http://localhost:${port}`;
(async () => {
  for (let i = 0; i < 120 && api.exitCode === null; i++) {
    try {
      const r = await fetch(`${base}/api/health`);
      if (r.ok) break;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  console.log(`
  Tappet is running at ${base}
  Mail sink (every e-mail the app sends): http://localhost:${sinkHttpPort}
  Fake Stripe (local payments stand-in, test card prefilled): http://127.0.0.1:${stripePort}
  Data folder: ${dataDir}

  Demo sign-ins (password: tappet-demo)
    owner@harbour-works.test       owner of Harbour Works
    mechanic@harbour-works.test    mechanic
    buyer@harbour-works.test       parts buyer
    viewer@harbour-works.test      viewer
    owner@brackenfold-garage.test  owner of Brackenfold Garage
    admin@tappet.test              platform admin

  Press Ctrl+C to stop.
`);
})();
