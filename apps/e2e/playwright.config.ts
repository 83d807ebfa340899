import { defineConfig, devices } from '@playwright/test';

// Browser tests drive Debian's Chromium (Playwright's own browser download cannot work here).
// The stack runs on its own ports with a throw-away data folder, so a running demo is untouched.
// E2E_PORT_BASE moves all three ports (app = base, SMTP = base − 1975, mail-sink HTTP = base − 1920),
// so two browser runs on one machine do not clash.
const base = Number(process.env.E2E_PORT_BASE ?? 3100);
export const e2ePorts = { app: base, smtp: base - 1975, sinkHttp: base - 1920 } as const;

export default defineConfig({
  testDir: './tests',
  outputDir: `../../test-results/e2e-${base}`,
  fullyParallel: true,
  workers: process.env.CI ? 2 : 2,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list']],
  use: {
    baseURL: `http://localhost:${e2ePorts.app}`,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
    },
  },
  projects: [
    { name: 'desktop', use: { ...devices['Desktop Chrome'], viewport: { width: 1280, height: 800 } } },
  ],
  webServer: {
    command: 'node tools/scripts/e2e-server.mjs',
    cwd: '../..',
    url: `http://localhost:${e2ePorts.app}/api/health`,
    timeout: 180_000,
    reuseExistingServer: false,
    stdout: 'ignore',
    stderr: 'pipe',
    env: { E2E_PORT: String(e2ePorts.app), E2E_SMTP_PORT: String(e2ePorts.smtp), E2E_SINK_HTTP_PORT: String(e2ePorts.sinkHttp) },
  },
});
