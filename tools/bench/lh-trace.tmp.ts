import * as chromeLauncher from 'chrome-launcher';
import lighthouse from 'lighthouse';
const [url, cookie, out] = process.argv.slice(2);
const chrome = await chromeLauncher.launch({ chromePath: '/usr/bin/chromium', chromeFlags: ['--headless=new', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'] });
const r = await lighthouse(url!, { port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance'], extraHeaders: { Cookie: cookie! }, gatherMode: out, auditMode: out } as never);
console.log(r?.lhr.categories.performance?.score, r?.lhr.audits['largest-contentful-paint']?.displayValue, r?.lhr.audits['total-blocking-time']?.displayValue);
await chrome.kill();
