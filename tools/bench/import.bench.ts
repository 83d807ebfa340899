// Catalogue import (issue 14): one CSV of new parts committed at 10k, 50k, 100k and 200k rows, each in
// a fresh process so its peak memory (ru_maxrss) is its own. Target at 100k: ≤ 30 s, ≤ 400 MB.
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { single, type Figure } from './harness';

const child = fileURLToPath(new URL('./import-child.ts', import.meta.url));
const tsx = fileURLToPath(new URL('../../node_modules/.bin/tsx', import.meta.url));

export function runImportBench(sizes = [10_000, 50_000, 100_000, 200_000]): Figure[] {
  const figures: Figure[] = [];
  for (const rows of sizes) {
    const run = spawnSync(tsx, [child, String(rows)], { encoding: 'utf8', maxBuffer: 16 * 2 ** 20 });
    const line = run.stdout.trim().split('\n').at(-1) ?? '';
    if (run.status !== 0 || !line.startsWith('{')) throw new Error(`import benchmark at ${rows} rows failed:\n${run.stderr}`);
    const r = JSON.parse(line) as { seconds: number; maxRssMB: number; fileMB: number };
    const n = rows.toLocaleString('en');
    const at100k = rows === 100_000;
    figures.push(single(`import: commit ${n} new parts (CSV ${r.fileMB.toFixed(1)} MB)`, 's', r.seconds, at100k ? { target: '≤ 30 s', met: r.seconds <= 30, note: 'one run' } : { note: 'one run' }));
    figures.push(single(`import: peak memory of the process, ${n} rows`, 'MB', r.maxRssMB, at100k ? { target: '≤ 400 MB', met: r.maxRssMB <= 400 } : {}));
  }
  return figures;
}
