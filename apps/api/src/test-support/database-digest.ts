import { createHash } from 'node:crypto';
import type { Database } from '../db/write-lock';

/**
 * A digest of every row of every table, for tests that say a refused request "changes nothing":
 * compare the digests before and after. Sessions are left out: each request moves its idle clock;
 * so are rate-limit counters: a refused request still counts against its sender's allowance.
 */
export async function databaseDigest(db: Database): Promise<Record<string, string>> {
  const tables = (await db.reader.query(`SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'part_search_%' AND name NOT IN ('sessions', 'rate_limit_counters') ORDER BY name`)) as Array<{ name: string }>;
  const out: Record<string, string> = {};
  for (const { name } of tables) {
    const rows = (await db.reader.query(`SELECT * FROM "${name}"`)) as unknown[];
    const lines = rows.map((r) => JSON.stringify(r)).sort();
    out[name] = `${rows.length} rows, ${createHash('sha256').update(lines.join('\n')).digest('hex').slice(0, 16)}`;
  }
  return out;
}
