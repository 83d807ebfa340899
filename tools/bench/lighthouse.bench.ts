// Lighthouse (issue 14): the lookup and part pages of the demo, signed in as the demo mechanic,
// in Debian's Chromium, with Lighthouse 12's default (mobile, simulated throttling) and desktop
// settings. Targets: performance ≥ 90, accessibility ≥ 95. Needs the built web app (dist/apps/web).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as chromeLauncher from 'chrome-launcher';
import lighthouse from 'lighthouse';
import desktopConfig from 'lighthouse/core/config/desktop-config.js';
import { single, type Figure } from './harness';

const repo = fileURLToPath(new URL('../..', import.meta.url));
const PORT = 3971;
const base = `http://localhost:${PORT}`;
const chromeFlags = ['--headless=new', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'];

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
  throw new Error('The API did not start for the Lighthouse benchmark.');
}

export async function runLighthouseBench(): Promise<Figure[]> {
  if (!fs.existsSync(path.join(repo, 'dist/apps/web/index.html'))) {
    const build = spawnSync('npx', ['vite', 'build', '-c', 'apps/web/vite.config.ts', '--logLevel', 'warn'], { cwd: repo, stdio: 'inherit' });
    if (build.status !== 0) throw new Error('The web build failed.');
  }
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-lighthouse-'));
  const env = { ...process.env, TAPPET_MODE: 'demo', PORT: String(PORT), TAPPET_DATA_DIR: dir, LOG_LEVEL: 'warn', SMTP_PORT: '1', MAIL_SINK_HTTP_PORT: '1' };
  const tsx = path.join(repo, 'node_modules/.bin/tsx');
  const seeded = spawnSync(tsx, ['seeds/seed-cli.ts'], { cwd: repo, env, encoding: 'utf8' });
  if (seeded.status !== 0) throw new Error(`The demo seed failed:\n${seeded.stderr}`);
  // A server left over from an interrupted run would answer instead of this one.
  if (await fetch(`${base}/api/health`).then(() => true, () => false)) throw new Error(`Something already answers on ${base}: stop it first.`);
  const server = spawn(tsx, ['apps/api/src/main.ts'], { cwd: repo, env, stdio: 'ignore' });
  const chrome = await chromeLauncher.launch({ chromePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', chromeFlags });
  // Taken now, so that an early exit is not missed when the benchmark stops it.
  const exited = new Promise<void>((resolve) => server.once('exit', () => resolve()));
  try {
    await waitForHealth(server);
    const res = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF': '1', Origin: base }, body: JSON.stringify({ email: 'mechanic@harbour-works.test', password: 'tappet-demo' }) });
    if (!res.ok) throw new Error(`sign-in failed: ${res.status}`);
    const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const me = (await (await fetch(`${base}/api/me`, { headers: { cookie } })).json()) as { memberships: Array<{ shopId: string }> };
    const shopId = me.memberships[0]!.shopId;
    const list = (await (await fetch(`${base}/api/shops/${shopId}/parts?pageSize=1`, { headers: { cookie } })).json()) as { items: Array<{ id: string }> };
    const pages = [
      { name: 'lookup page', url: `${base}/shops/${shopId}/lookup` },
      { name: 'part page', url: `${base}/shops/${shopId}/catalogue/${list.items[0]!.id}` },
    ];
    const figures: Figure[] = [];
    // A single Lighthouse run swings by several points on a shared machine: each page and preset
    // runs LIGHTHOUSE_RUNS times (5 unless told) and the figures are the median run's, by score.
    const runs = Math.max(1, Number(process.env.LIGHTHOUSE_RUNS ?? 5));
    const presets = (process.env.LIGHTHOUSE_PRESETS ?? 'mobile,desktop').split(',');
    for (const page of pages) {
      for (const [preset, config] of [
        ['mobile', undefined],
        ['desktop', desktopConfig],
      ] as const) {
        if (!presets.includes(preset)) continue;
        const results: Array<{ perf: number; a11y: number; lcp: string; tbt: string }> = [];
        for (let run = 0; run < runs; run++) {
          // Lighthouse sometimes loses the trace of a load (NO_NAVSTART) on a busy machine: one more try.
          let result = await lighthouse(page.url, { port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance', 'accessibility'], extraHeaders: { Cookie: cookie } }, config);
          if (result?.lhr.runtimeError) result = await lighthouse(page.url, { port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance', 'accessibility'], extraHeaders: { Cookie: cookie } }, config);
          if (!result) throw new Error(`Lighthouse gave no result for ${page.url}`);
          // LIGHTHOUSE_REPORT_DIR=… keeps each full report (LCP element, request chains, long tasks) for study.
          if (process.env.LIGHTHOUSE_REPORT_DIR) {
            fs.mkdirSync(process.env.LIGHTHOUSE_REPORT_DIR, { recursive: true });
            fs.writeFileSync(path.join(process.env.LIGHTHOUSE_REPORT_DIR, `${page.name.replace(/\W+/g, '-')}-${preset}-${run + 1}.json`), JSON.stringify(result.lhr));
          }
          const { performance, accessibility } = result.lhr.categories;
          const lcpAudit = result.lhr.audits['largest-contentful-paint'];
          results.push({
            perf: Math.round((performance?.score ?? 0) * 100),
            a11y: Math.round((accessibility?.score ?? 0) * 100),
            lcp: lcpAudit?.displayValue ? `largest contentful paint ${lcpAudit.displayValue}` : `no largest contentful paint: ${lcpAudit?.errorMessage ?? result.lhr.runtimeError?.message ?? 'unknown'}`,
            tbt: result.lhr.audits['total-blocking-time']?.displayValue ?? '?',
          });
        }
        results.sort((a, b) => a.perf - b.perf);
        const median = results[Math.floor((results.length - 1) / 2)]!;
        const spread = runs > 1 ? `; ${runs} runs, scores ${results.map((r) => r.perf).join(', ')}` : '';
        figures.push(single(`Lighthouse ${preset}: ${page.name}, performance`, '%', median.perf, { target: '≥ 90', met: median.perf >= 90, note: `${median.lcp}, total blocking time ${median.tbt}${spread}` }));
        const a11y = Math.min(...results.map((r) => r.a11y));
        figures.push(single(`Lighthouse ${preset}: ${page.name}, accessibility`, '%', a11y, { target: '≥ 95', met: a11y >= 95, note: runs > 1 ? 'the lowest of the runs' : undefined }));
      }
    }
    return figures;
  } finally {
    chrome.kill();
    server.kill('SIGTERM');
    await exited;
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
