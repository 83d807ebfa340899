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

/**
 * Rewrites SQLite-flavoured SQL for PostgreSQL, outside string literals, quoted identifiers and
 * dollar-quoted bodies: `?` → `$1, $2, …`; `LIKE` → `ILIKE` (SQLite's LIKE ignores ASCII case);
 * an unquoted camelCase alias (`AS shopId`) is quoted, since PostgreSQL would fold it to lower case.
 * `COLLATE NOCASE` needs no rewrite: the first PostgreSQL migration creates a collation `nocase`.
 */
export function translateSql(sql: string): string {
  let out = '';
  let n = 0;
  let i = 0;
  let plain = '';
  const flush = () => {
    out += plain
      .replace(/\?/g, () => `$${++n}`)
      .replace(/\bLIKE\b/gi, 'ILIKE')
      .replace(/\bAS(\s+)([a-z][a-z0-9_]*[A-Z][A-Za-z0-9_]*)\b/g, 'AS$1"$2"');
    plain = '';
  };
  while (i < sql.length) {
    const c = sql[i];
    if (c === "'" || c === '"') {
      flush();
      let j = i + 1;
      while (j < sql.length) {
        if (sql[j] === c) {
          if (sql[j + 1] === c) j += 2;
          else break;
        } else j++;
      }
      out += sql.slice(i, j + 1);
      i = j + 1;
    } else if (c === '$' && /^\$[A-Za-z_]*\$/.test(sql.slice(i))) {
      flush();
      const tag = /^\$[A-Za-z_]*\$/.exec(sql.slice(i))![0];
      const end = sql.indexOf(tag, i + tag.length);
      const stop = end < 0 ? sql.length : end + tag.length;
      out += sql.slice(i, stop);
      i = stop;
    } else {
      plain += c;
      i++;
    }
  }
  flush();
  return out;
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
