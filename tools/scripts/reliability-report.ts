// `npm run reliability`: runs the reliability suites (crash, backup, shutdown, hostile input, the
// write lock and the concurrency tests) and the security suites (authorisation, sessions, CSRF,
// rate limits, uploads, CSV) in one Vitest run, then rewrites the results table at the end of
// docs/reliability.md (one row per test) and of docs/security.md (one row per suite) from what
// actually happened in this run. The import crash test runs at 100,000 rows here
// (TAPPET_CRASH_IMPORT_ROWS overrides it).
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/** The import crash test's size here: the 100,000 rows issue 13 asks for (`npm test` runs 20,000). */
const importCrashRows = Number(process.env['TAPPET_CRASH_IMPORT_ROWS'] ?? 100_000);

interface Suite {
  file: string;
  tries: string;
}

/** The reliability suites, with what each one tries. */
export const reliabilitySuites: Suite[] = [
  { file: 'apps/api/src/db/__tests__/write-lock.test.ts', tries: 'overlapping transactions, one rolling back, through the shared connection' },
  { file: 'apps/api/src/db/__tests__/crash.test.ts', tries: `SIGKILL at 20 %, 50 %, 80 % and 95 % of a ${importCrashRows.toLocaleString('en-GB')}-row import commit` },
  { file: 'apps/api/src/db/__tests__/crash-receipt.test.ts', tries: 'SIGKILL at 30 %, 60 % and 90 % of receiving a 500-line purchase order in one receipt' },
  { file: 'apps/api/src/db/__tests__/crash-count.test.ts', tries: 'SIGKILL at 30 %, 60 % and 90 % of posting a 1,000-line stock count' },
  { file: 'apps/api/src/db/__tests__/backup.test.ts', tries: 'an online backup in another process while four writers move stock; restores into running, damaged and empty targets' },
  { file: 'apps/api/src/__tests__/graceful-shutdown.test.ts', tries: 'SIGTERM while a request body is still arriving' },
  { file: 'apps/api/src/__tests__/hostile-input.test.ts', tries: 'malformed, deep, oversized, wrongly typed and Unicode-tricked bodies; page sizes; generated queries, forms and files' },
  { file: 'apps/api/src/modules/stock/__tests__/stock-concurrency.test.ts', tries: 'many concurrent holds and issues of the last units' },
  { file: 'apps/api/src/modules/sales/__tests__/invoices.test.ts', tries: 'twenty invoices issued at once: numbers without gaps' },
  { file: 'apps/api/src/modules/counts/__tests__/counts.test.ts', tries: 'two people counting one bin at once while stock moves' },
];

/** The security suites, with what each one tries (docs/security.md names the control each proves). */
export const securitySuites: Suite[] = [
  { file: 'apps/api/src/__tests__/authorization-matrix.test.ts', tries: 'every API route × signed out, each role, another shop’s owner (whose writes change no row), a platform admin with and without support access, an API key, a suspended shop; an audit entry and an e-mail allowance for every write route' },
  { file: 'apps/api/src/__tests__/cross-shop-ids.test.ts', tries: 'another shop’s ids inside the bodies of 21 writes, every table compared before and after' },
  { file: 'apps/api/src/__tests__/hostile-input.test.ts', tries: 'malformed, deep, oversized, wrongly typed and Unicode-tricked input; page sizes; path tricks in file names; generated input (fast-check)' },
  { file: 'apps/api/src/modules/uploads/__tests__/uploads.test.ts', tries: 'scripts named .jpg, HTML and SVG, a decompression bomb, oversized and too many files, path tricks in names, failures part-way' },
  { file: 'apps/api/src/modules/catalogue/__tests__/csv-guard.test.ts', tries: 'generated cells through the CSV formula guard and back' },
  { file: 'apps/api/src/modules/auth/__tests__/sign-in.test.ts', tries: 'sign-in: cookie attributes, a new token at each sign-in' },
  { file: 'apps/api/src/modules/auth/__tests__/sessions.test.ts', tries: 'idle and absolute time-outs, deactivation, the __Host- cookie over https' },
  { file: 'apps/api/src/modules/auth/__tests__/password-reset.test.ts', tries: 'reset links: single use, expiry, every session ended, rate limits' },
  { file: 'apps/api/src/modules/auth/__tests__/rate-limit.test.ts', tries: 'password guessing per account and per address' },
  { file: 'apps/api/src/modules/auth/__tests__/csrf.test.ts', tries: 'cross-site writes: missing header, wrong content type, foreign origin' },
  { file: 'apps/api/src/middleware/__tests__/rate-limits.test.ts', tries: 'the e-mail allowance and the pay-link limit' },
  { file: 'apps/api/src/modules/staff/__tests__/staff.test.ts', tries: 'staff: invitations rate-limited, a buyer raising their own limit, deactivation ending sessions' },
  { file: 'apps/api/src/modules/api-keys/__tests__/api-keys.test.ts', tries: 'API keys: hashed, own shop only, no administration, revocation' },
  { file: 'apps/api/src/modules/platform/__tests__/support-access.test.ts', tries: 'support access only under the owner’s time-boxed grant' },
  { file: 'apps/api/src/__tests__/app.test.ts', tries: 'security headers, error shape, no stack traces' },
];

interface VitestJson {
  testResults: Array<{ name: string; assertionResults: Array<{ fullName: string; title: string; status: string; duration?: number; failureMessages: string[] }> }>;
}

const repo = path.resolve(import.meta.dirname, '../..');
const out = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-reliability-')), 'results.json');
const files = [...new Set([...reliabilitySuites, ...securitySuites].map((s) => s.file))].filter((f) => fs.existsSync(path.join(repo, f)));
const run = spawnSync('npx', ['vitest', 'run', '--project', 'api', '--reporter=json', `--outputFile=${out}`, ...files], {
  cwd: repo,
  stdio: ['ignore', 'inherit', 'inherit'],
  env: { ...process.env, TAPPET_CRASH_IMPORT_ROWS: String(importCrashRows) },
});
const results = JSON.parse(fs.readFileSync(out, 'utf8')) as VitestJson;
const resultOf = (suite: Suite) => results.testResults.find((r) => r.name.endsWith(suite.file));
const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;
const firstLine = (t: { failureMessages: string[] }) => (t.failureMessages[0] ?? '').split('\n')[0];

const reliabilityRows: string[] = [];
for (const suite of reliabilitySuites) {
  const file = resultOf(suite);
  if (!file) {
    reliabilityRows.push(`| ${suite.tries} | \`${suite.file}\` | — | not run (suite missing) |`);
    continue;
  }
  for (const t of file.assertionResults) {
    const held = t.status === 'passed' ? 'held' : `**FAILED**: ${firstLine(t)}`;
    reliabilityRows.push(`| ${suite.tries} | \`${path.basename(suite.file)}\` › ${t.title} | ${seconds(t.duration ?? 0)} | ${held} |`);
  }
}

const securityRows = securitySuites.map((suite) => {
  const file = resultOf(suite);
  if (!file) return `| ${suite.tries} | \`${suite.file}\` | — | — | not run (suite missing) |`;
  const tests = file.assertionResults;
  const failed = tests.filter((t) => t.status === 'failed');
  const ms = tests.reduce((sum, t) => sum + (t.duration ?? 0), 0);
  const held = failed.length === 0 ? 'held' : `**${failed.length} FAILED**: ${failed[0]!.title}: ${firstLine(failed[0]!)}`;
  return `| ${suite.tries} | \`${suite.file.replace('apps/api/src/', '')}\` | ${tests.filter((t) => t.status === 'passed').length} of ${tests.length} | ${seconds(ms)} | ${held} |`;
});

const when = `Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'CPU'}, Node ${process.version}.`;

/** Replaces everything after the marker in a doc with the table. */
function writeResults(docPath: string, marker: string, table: string): void {
  const doc = path.join(repo, docPath);
  const head = fs.readFileSync(doc, 'utf8').split(marker)[0]!.trimEnd();
  fs.writeFileSync(doc, `${head}\n\n${marker}\n\n${table}`);
  console.log(table);
}

writeResults(
  'docs/reliability.md',
  '<!-- results: written by `npm run reliability`; do not edit below -->',
  `${when}\n\n| what was tried | test | time | result |\n| --- | --- | ---: | --- |\n${reliabilityRows.join('\n')}\n`,
);
writeResults(
  'docs/security.md',
  '<!-- results: written by `npm run reliability`; do not edit below -->',
  `## Results\n\n${when} One row per suite; each suite's tests are listed by \`npx vitest run --project api <file>\`.\n\n| what was tried | suite | tests passed | time | result |\n| --- | --- | ---: | ---: | --- |\n${securityRows.join('\n')}\n`,
);
process.exit(run.status ?? 1);
