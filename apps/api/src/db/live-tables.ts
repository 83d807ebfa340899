import type { DataSource } from 'typeorm';

/** A table as the live schema has it: its columns in order and its primary-key columns. */
export interface LiveTable {
  name: string;
  columns: string[];
  primary: string[];
}

/**
 * Every table of the database as it stands (migrations included, entities or not). On PostgreSQL
 * it reads information_schema itself: TypeORM's getTables() runs its catalogue queries in
 * parallel on one client, which pg deprecates (and pg 9 will refuse).
 */
export async function liveTables(dataSource: DataSource): Promise<LiveTable[]> {
  if (dataSource.options.type === 'postgres') {
    const columns = await dataSource.query<Array<{ table: string; column: string }>>(
      `SELECT table_name AS "table", column_name AS "column" FROM information_schema.columns
       WHERE table_schema = current_schema() ORDER BY table_name, ordinal_position`,
    );
    const keys = await dataSource.query<Array<{ table: string; column: string }>>(
      `SELECT k.table_name AS "table", k.column_name AS "column"
       FROM information_schema.table_constraints c
       JOIN information_schema.key_column_usage k ON k.constraint_schema = c.constraint_schema AND k.constraint_name = c.constraint_name AND k.table_name = c.table_name
       WHERE c.constraint_type = 'PRIMARY KEY' AND c.table_schema = current_schema() ORDER BY k.table_name, k.ordinal_position`,
    );
    const tables = new Map<string, LiveTable>();
    for (const c of columns) {
      const t = tables.get(c.table) ?? { name: c.table, columns: [], primary: [] };
      t.columns.push(c.column);
      tables.set(c.table, t);
    }
    for (const k of keys) tables.get(k.table)?.primary.push(k.column);
    return [...tables.values()];
  }
  const runner = dataSource.createQueryRunner();
  try {
    return (await runner.getTables()).map((t) => ({ name: t.name, columns: t.columns.map((c) => c.name), primary: t.columns.filter((c) => c.isPrimary).map((c) => c.name) }));
  } finally {
    await runner.release();
  }
}
