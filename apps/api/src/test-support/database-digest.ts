import { createHash } from 'node:crypto';
import type { Database } from '../db/write-lock';

/**
 * A digest of every row of every table, for tests that say a refused request "changes nothing":
 * compare the digests before and after. Sessions are left out: each request moves its idle clock;
 * so are rate-limit counters: a refused request still counts against its sender's allowance.
 */
export async function databaseDigest(db: Database): Promise<Record<string, string>> {
  const listTables =
    db.dataSource.options.type === 'postgres'
      ? `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = current_schema() AND table_type = 'BASE TABLE' AND table_name NOT IN ('migrations', 'typeorm_metadata') AND table_name NOT LIKE 'part\\_search%' ESCAPE '\\'`
      : `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'part_search_%'`;
  const tables = ((await db.reader.query(listTables)) as Array<{ name: string }>).filter((t) => !['sessions', 'rate_limit_counters'].includes(t.name)).sort((a, b) => a.name.localeCompare(b.name));
  const out: Record<string, string> = {};
  for (const { name } of tables) {
    const rows = (await db.reader.query(`SELECT * FROM "${name}"`)) as unknown[];
    const lines = rows.map((r) => JSON.stringify(r)).sort();
    out[name] = `${rows.length} rows, ${createHash('sha256').update(lines.join('\n')).digest('hex').slice(0, 16)}`;
  }
  return out;
}
