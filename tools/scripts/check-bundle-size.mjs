// Fails when the web app's initial JavaScript (the entry script and every chunk it imports
// statically) exceeds its gzipped budget. A size check, not a timing: it is exact on any machine.
// Routes loaded on demand (dynamic import()) do not count.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

export const budgetBytes = 200 * 1024;
const webDir = process.argv[2] ?? 'dist/apps/web';

/** Static imports of one built chunk: `import … from "./x.js"` and bare `import "./x.js"`. */
function staticImports(code) {
  const found = new Set();
  const re = /(?:\bfrom\s*|\bimport\s*)["'](\.{1,2}\/[^"']+\.js)["']/g;
  for (const m of code.matchAll(re)) found.add(m[1]);
  return [...found];
}

export function initialChunks(dir) {
  const html = readFileSync(join(dir, 'index.html'), 'utf8');
  const entries = [...html.matchAll(/<script[^>]+type="module"[^>]+src="\/([^"]+)"/g)].map((m) => m[1]);
  const seen = new Set();
  const queue = [...entries];
  while (queue.length) {
    const file = queue.shift();
    if (seen.has(file)) continue;
    seen.add(file);
    const code = readFileSync(join(dir, file), 'utf8');
    for (const rel of staticImports(code)) queue.push(join(file, '..', rel).replace(/\\/g, '/'));
  }
  return [...seen];
}

const files = initialChunks(webDir);
let total = 0;
for (const f of files) total += gzipSync(readFileSync(join(webDir, f)), { level: 9 }).length;
const kb = (n) => `${(n / 1024).toFixed(1)} KB`;
console.log(`Initial JavaScript: ${files.length} file(s), ${kb(total)} gzipped (budget ${kb(budgetBytes)}).`);
if (total > budgetBytes) {
  console.error(`✗ Over budget by ${kb(total - budgetBytes)}: load more routes on demand (React Router lazy routes).`);
  process.exit(1);
}
