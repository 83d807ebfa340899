// Makes sure Debian's Chromium is there for the browser tests. Playwright's own browser download
// cannot work on these machines (no network but the package registries), so we use the system one.
import { existsSync } from 'node:fs';
import { execFileSync } from 'node:child_process';

export const chromiumPath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export function ensureChromium() {
  if (existsSync(chromiumPath)) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  let hasApt;
  try {
    execFileSync('which', ['apt-get'], { stdio: 'ignore' });
    hasApt = true;
  } catch {
    hasApt = false;
  }
  if (!isRoot || !hasApt) {
    console.error(
      `Chromium is missing at ${chromiumPath} and cannot be installed automatically here.\n` +
        `Install Debian's package as root:  apt-get update && apt-get install -y chromium\n` +
        `or point CHROMIUM_PATH at a Chromium or Chrome binary, then run npm test again.`,
    );
    process.exit(1);
  }
  console.log('Chromium is missing: installing Debian\'s "chromium" package (apt-get)…');
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  if (!existsSync(chromiumPath)) {
    console.error(`apt-get finished but ${chromiumPath} is still missing.`);
    process.exit(1);
  }
}

if (import.meta.url === `file://${process.argv[1]}`) ensureChromium();
