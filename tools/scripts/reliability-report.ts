// `npm run reliability`: runs the reliability suites (crash, backup, shutdown, hostile input, the
// write lock and the concurrency tests) and rewrites the results table at the end of
// docs/reliability.md from what actually happened in this run. The import crash test runs at
// 100,000 rows here (TAPPET_CRASH_IMPORT_ROWS overrides it).
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/** The import crash test's size here: the 100,000 rows issue 13 asks for (`npm test` runs 20,000). */
const importCrashRows = Number(process.env['TAPPET_CRASH_IMPORT_ROWS'] ?? 100_000);

/** The suites, with what each one tries. */
export const reliabilitySuites: Array<{ file: string; tries: string }> = [
  { file: 'apps/api/src/db/__tests__/write-lock.test.ts', tries: 'overlapping transactions, one rolling back, through the shared connection' },
  { file: 'apps/api/src/db/__tests__/crash.test.ts', tries: `SIGKILL at 20 %, 50 %, 80 % and 95 % of a ${importCrashRows.toLocaleString('en-GB')}-row import commit` },
  { file: 'apps/api/src/db/__tests__/crash-receipt.test.ts', tries: 'SIGKILL at 30 %, 60 % and 90 % of receiving a 500-line purchase order in one receipt' },
  { file: 'apps/api/src/db/__tests__/crash-count.test.ts', tries: 'SIGKILL at 30 %, 60 % and 90 % of posting a 1,000-line stock count' },
  { file: 'apps/api/src/db/__tests__/backup.test.ts', tries: 'an online backup in another process while four writers move stock; restores into running, damaged and empty targets' },
  { file: 'apps/api/src/__tests__/graceful-shutdown.test.ts', tries: 'SIGTERM while a request body is still arriving' },
  { file: 'apps/api/src/__tests__/hostile-input.test.ts', tries: 'malformed, deep, oversized, wrongly typed and Unicode-tricked bodies; generated queries, forms and files' },
  { file: 'apps/api/src/modules/stock/__tests__/stock-concurrency.test.ts', tries: 'many concurrent holds and issues of the last units' },
  { file: 'apps/api/src/modules/sales/__tests__/invoices.test.ts', tries: 'twenty invoices issued at once: numbers without gaps' },
  { file: 'apps/api/src/modules/counts/__tests__/counts.test.ts', tries: 'two people counting one bin at once while stock moves' },
];

interface VitestJson {
  testResults: Array<{ name: string; assertionResults: Array<{ fullName: string; title: string; status: string; duration?: number; failureMessages: string[] }> }>;
}

const repo = path.resolve(import.meta.dirname, '../..');
const out = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-reliability-')), 'results.json');
const files = reliabilitySuites.map((s) => s.file).filter((f) => fs.existsSync(path.join(repo, f)));
const run = spawnSync('npx', ['vitest', 'run', '--project', 'api', '--reporter=json', `--outputFile=${out}`, ...files], {
  cwd: repo,
  stdio: ['ignore', 'inherit', 'inherit'],
  env: { ...process.env, TAPPET_CRASH_IMPORT_ROWS: String(importCrashRows) },
});
const results = JSON.parse(fs.readFileSync(out, 'utf8')) as VitestJson;

const rows: string[] = [];
for (const suite of reliabilitySuites) {
  const file = results.testResults.find((r) => r.name.endsWith(suite.file));
  if (!file) {
    rows.push(`| ${suite.tries} | \`${suite.file}\` | — | not run (suite missing) |`);
    continue;
  }
  for (const t of file.assertionResults) {
    const held = t.status === 'passed' ? 'held' : `**FAILED**: ${(t.failureMessages[0] ?? '').split('\n')[0]}`;
    rows.push(`| ${suite.tries} | \`${path.basename(suite.file)}\` › ${t.title} | ${((t.duration ?? 0) / 1000).toFixed(1)} s | ${held} |`);
  }
}

const doc = path.join(repo, 'docs/reliability.md');
const marker = '<!-- results: written by `npm run reliability`; do not edit below -->';
const head = fs.readFileSync(doc, 'utf8').split(marker)[0]!.trimEnd();
const table = `${marker}\n\nRun ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'CPU'}, Node ${process.version}.\n\n| what was tried | test | time | result |\n| --- | --- | ---: | --- |\n${rows.join('\n')}\n`;
fs.writeFileSync(doc, `${head}\n\n${table}`);
console.log(table);
process.exit(run.status ?? 1);
