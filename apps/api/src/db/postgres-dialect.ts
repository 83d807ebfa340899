import { EntitySchema, type DataSource, type EntitySchemaColumnOptions, type QueryRunner, type ValueTransformer } from 'typeorm';
import { types as pgTypes } from 'pg';

/**
 * Everything that lets the SQLite-shaped app run unchanged on PostgreSQL, in one place (decision
 * 019): services keep writing SQLite-flavoured SQL (`?` placeholders, `LIKE` that ignores ASCII
 * case, camelCase aliases) and reading SQLite-shaped values (text times, integer flags, numbers);
 * this module translates on the way in and out. Nothing outside `db/` asks which database it is on,
 * except the part search, which has an implementation per database behind its interface.
 */

/** SQLite's text form of a time, as TypeORM's SQLite driver writes it: UTC `YYYY-MM-DD HH:MM:SS.SSS`. */
export const sqliteTimeText = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', '');

/** Text times on PostgreSQL, so that `created_at < ?` compares the same strings on both databases. */
const textTime: ValueTransformer = {
  to: (value: unknown) => (value instanceof Date ? sqliteTimeText(value) : value),
  from: (value: unknown) => (typeof value === 'string' ? new Date(`${value.replace(' ', 'T')}Z`) : value),
};

/** Integer flags (0/1) on PostgreSQL, as on SQLite, because raw SQL compares them with 1 and 0. */
const integerFlag: ValueTransformer = {
  to: (value: unknown) => (typeof value === 'boolean' ? (value ? 1 : 0) : value),
  from: (value: unknown) => (value === null || value === undefined ? value : Number(value) !== 0),
};

/**
 * The PostgreSQL twin of an entity schema: same name (TypeORM finds metadata by name, so services
 * keep passing the original schema), columns mapped to the types the PostgreSQL migrations create.
 */
export function postgresEntity<T>(schema: EntitySchema<T>): EntitySchema<T> {
  const columns: Record<string, EntitySchemaColumnOptions> = {};
  for (const [name, column] of Object.entries(schema.options.columns as Record<string, EntitySchemaColumnOptions>)) {
    if (column.type === 'datetime') columns[name] = { ...column, type: 'text', transformer: textTime };
    else if (column.type === 'boolean') columns[name] = { ...column, type: 'integer', transformer: integerFlag };
    else if (column.type === 'real') columns[name] = { ...column, type: 'double precision' };
    else columns[name] = column;
  }
  return new EntitySchema<T>({ ...schema.options, columns } as typeof schema.options);
}

/**
 * pg returns int8 (COUNT, SUM of integers) and numeric (SUM of int8) as strings, because they can
 * exceed 2^53. Our money and quantities are integers far below that, and SQLite hands services
 * numbers, so both are parsed to numbers here: services see the same values on both databases.
 */
export const pgNumberTypes = {
  getTypeParser(oid: number, format?: 'text' | 'binary') {
    if (oid === pgTypes.builtins.INT8 || oid === pgTypes.builtins.NUMERIC) return (value: string) => Number(value);
    return pgTypes.getTypeParser(oid, format);
  },
};

/** A parameter as SQLite would store it: Date → text time, boolean → 0/1. */
function sqliteShapedParameter(value: unknown): unknown {
  if (value instanceof Date) return sqliteTimeText(value);
  if (typeof value === 'boolean') return value ? 1 : 0;
  return value;
}

/** SQL cut into pieces to rewrite (`plain`) and pieces to keep: string literals, quoted identifiers, dollar-quoted bodies. */
function pieces(sql: string): Array<{ plain: boolean; text: string }> {
  const out: Array<{ plain: boolean; text: string }> = [];
  let plain = '';
  let i = 0;
  const keep = (text: string) => {
    if (plain) out.push({ plain: true, text: plain });
    plain = '';
    out.push({ plain: false, text });
  };
  while (i < sql.length) {
    const c = sql[i]!;
    const dollar = c === '$' ? /^\$[A-Za-z_]*\$/.exec(sql.slice(i)) : null;
    if (c === "'" || c === '"') {
      let j = i + 1;
      while (j < sql.length && !(sql[j] === c && sql[j + 1] !== c)) j += sql[j] === c ? 2 : 1;
      keep(sql.slice(i, j + 1));
      i = j + 1;
    } else if (dollar) {
      const end = sql.indexOf(dollar[0], i + dollar[0].length);
      const stop = end < 0 ? sql.length : end + dollar[0].length;
      keep(sql.slice(i, stop));
      i = stop;
    } else {
      plain += c;
      i++;
    }
  }
  if (plain) out.push({ plain: true, text: plain });
  return out;
}

/** An unquoted camelCase alias: `AS shopId`. */
const camelAlias = /\bAS\s+([a-z][a-z0-9_]*[A-Z][A-Za-z0-9_]*)\b/g;

/**
 * Rewrites SQLite-flavoured SQL for PostgreSQL, outside string literals, quoted identifiers and
 * dollar-quoted bodies: `?` → `$1, $2, …`; `LIKE` → `ILIKE` (SQLite's LIKE ignores ASCII case);
 * unquoted camelCase aliases (`AS shopId`, and `ORDER BY shopId` after it) are quoted, since
 * PostgreSQL would fold them to lower case. `COLLATE NOCASE` needs no rewrite: the first
 * PostgreSQL migration creates a collation named `nocase`.
 */
export function translateSql(sql: string): string {
  const parts = pieces(sql);
  const aliases = new Set<string>();
  for (const p of parts) if (p.plain) for (const m of p.text.matchAll(camelAlias)) aliases.add(m[1]!);
  const aliasUse = aliases.size ? new RegExp(`(^|[^.\\w])(${[...aliases].join('|')})\\b`, 'g') : null;
  let n = 0;
  return parts
    .map((p) => {
      if (!p.plain) return p.text;
      let text = p.text.replace(/\?/g, () => `$${++n}`).replace(/\bLIKE\b/gi, 'ILIKE');
      if (aliasUse) text = text.replace(aliasUse, '$1"$2"');
      return text;
    })
    .join('');
}

const translated = new Map<string, string>();

function translateCached(sql: string): string {
  let result = translated.get(sql);
  if (result === undefined) {
    result = translateSql(sql);
    if (translated.size > 5000) translated.clear();
    translated.set(sql, result);
  }
  return result;
}

/**
 * Installs the translation on every query runner of a PostgreSQL data source. Also makes an
 * UPDATE/DELETE … RETURNING give its rows, as on SQLite (TypeORM's pg runner returns [rows, count]).
 */
export function installPostgresDialect(dataSource: DataSource): void {
  const driver = dataSource.driver;
  // Columns with a default come back from INSERT … RETURNING; TypeORM's pg driver merges them raw
  // (an integer flag would reach the entity as 1, not true), so they are hydrated here first.
  const createGeneratedMap = driver.createGeneratedMap.bind(driver);
  driver.createGeneratedMap = (metadata, insertResult: Record<string, unknown> | undefined, ...rest) => {
    if (!insertResult) return createGeneratedMap(metadata, insertResult, ...rest);
    const hydrated: Record<string, unknown> = {};
    for (const [key, value] of Object.entries(insertResult)) {
      const column = metadata.findColumnWithDatabaseName(key);
      hydrated[key] = column?.transformer ? driver.prepareHydratedValue(value, column) : value;
    }
    return createGeneratedMap(metadata, hydrated, ...rest);
  };
  const createQueryRunner = driver.createQueryRunner.bind(driver);
  driver.createQueryRunner = (mode) => {
    const runner: QueryRunner = createQueryRunner(mode);
    const query = runner.query.bind(runner);
    runner.query = (async (sql: string, parameters?: unknown[], useStructuredResult?: boolean) => {
      const text = translateCached(sql);
      const values = parameters?.map(sqliteShapedParameter);
      if (useStructuredResult) return query(text, values, true);
      if (!/\bRETURNING\b/i.test(text) || !/^\s*(UPDATE|DELETE)\b/i.test(text)) return query(text, values);
      const result = await query(text, values, true);
      return result.records;
    }) as QueryRunner['query'];
    return runner;
  };
}
