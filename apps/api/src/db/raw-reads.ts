import type { EntityManager, EntitySchema } from 'typeorm';

/**
 * Hand-written joins for the reads every request makes (session and person, membership and shop),
 * hydrated through TypeORM's own column metadata and driver conversions. TypeORM's find() spends
 * more time building its SQL than SQLite spends answering it; these run one prepared statement
 * instead of two built queries. Portable SQL: quoted identifiers, `?` placeholders rewritten to
 * `$n` for PostgreSQL.
 */

interface Compiled {
  sql: string;
  columns: { alias: string; prefix: string; entity: EntitySchema<object> }[];
}

const compiled = new Map<string, Compiled>();

/** `"s"."user_id" AS "s__user_id", …` for every column of the entity. */
function selectList(manager: EntityManager, entity: EntitySchema<object>, alias: string): string {
  return manager.connection
    .getMetadata(entity)
    .columns.map((c) => `"${alias}"."${c.databaseName}" AS "${alias}__${c.databaseName}"`)
    .join(', ');
}

function placeholders(manager: EntityManager, sql: string): string {
  if (manager.connection.options.type !== 'postgres') return sql;
  let n = 0;
  return sql.replace(/\?/g, () => `$${++n}`);
}

/** One entity's values out of a joined row, converted as TypeORM's find() would. */
function hydrate<T>(manager: EntityManager, entity: EntitySchema<T>, alias: string, row: Record<string, unknown>): T {
  const driver = manager.connection.driver;
  const out: Record<string, unknown> = {};
  for (const column of manager.connection.getMetadata(entity).columns) {
    out[column.propertyName] = driver.prepareHydratedValue(row[`${alias}__${column.databaseName}`], column);
  }
  return out as T;
}

/**
 * Reads one row joining the given entities (each with its alias) and returns each entity's part,
 * or null when there is no row. `from` is the FROM/JOIN/WHERE text using those aliases; the select
 * list is generated. The statement is compiled once per `name`.
 */
export async function readJoinedRow<A, B>(
  manager: EntityManager,
  name: string,
  entities: [[EntitySchema<A>, string], [EntitySchema<B>, string]],
  from: string,
  params: unknown[],
): Promise<[A, B] | null> {
  const key = `${manager.connection.options.type}:${name}`;
  let statement = compiled.get(key);
  if (!statement) {
    const select = entities.map(([entity, alias]) => selectList(manager, entity as EntitySchema<object>, alias)).join(', ');
    statement = {
      sql: placeholders(manager, `SELECT ${select} ${from} LIMIT 1`),
      columns: entities.map(([entity, alias]) => ({ alias, prefix: `${alias}__`, entity: entity as EntitySchema<object> })),
    };
    compiled.set(key, statement);
  }
  const rows = (await manager.query(statement.sql, params)) as Record<string, unknown>[];
  const row = rows[0];
  if (!row) return null;
  const [a, b] = entities;
  return [hydrate(manager, a[0], a[1], row), hydrate(manager, b[0], b[1], row)];
}
