import { describe, expect, it } from 'vitest';
import { sqliteTimeText, translateSql } from '../postgres-dialect';

describe('translateSql (SQLite-flavoured SQL for PostgreSQL)', () => {
  it('numbers ? placeholders in order', () => {
    expect(translateSql('SELECT id FROM parts WHERE shop_id = ? AND key IN (?, ?)')).toBe('SELECT id FROM parts WHERE shop_id = $1 AND key IN ($2, $3)');
  });

  it('leaves string literals, quoted identifiers and dollar-quoted bodies alone', () => {
    expect(translateSql(`SELECT '?' AS "a?b", x FROM t WHERE y = ? AND z LIKE 'LIKE ?'`)).toBe(`SELECT '?' AS "a?b", x FROM t WHERE y = $1 AND z ILIKE 'LIKE ?'`);
    expect(translateSql(`SELECT 'it''s ?' WHERE a = ?`)).toBe(`SELECT 'it''s ?' WHERE a = $1`);
    expect(translateSql('CREATE FUNCTION f() RETURNS int LANGUAGE sql AS $$ SELECT 1 WHERE ? LIKE x $$')).toBe('CREATE FUNCTION f() RETURNS int LANGUAGE sql AS $$ SELECT 1 WHERE ? LIKE x $$');
  });

  it('makes LIKE ignore case as SQLite does, without touching ILIKE or NOT LIKE', () => {
    expect(translateSql('a LIKE ? OR b like ? OR c ILIKE ? OR d NOT LIKE ?')).toBe('a ILIKE $1 OR b ILIKE $2 OR c ILIKE $3 OR d NOT ILIKE $4');
  });

  it('quotes camelCase aliases so PostgreSQL keeps their case, but not CAST types', () => {
    expect(translateSql('SELECT a.shop_id AS shopId, MAX(x) AS at, CAST(n AS TEXT) AS n FROM a')).toBe('SELECT a.shop_id AS "shopId", MAX(x) AS at, CAST(n AS TEXT) AS n FROM a');
  });

  it('leaves TypeORM’s own $n SQL as it is', () => {
    const sql = 'SELECT "u"."id" AS "u_id" FROM "users" "u" WHERE "u"."email" = $1';
    expect(translateSql(sql)).toBe(sql);
  });
});

describe('sqliteTimeText', () => {
  it('writes UTC times as TypeORM’s SQLite driver does', () => {
    expect(sqliteTimeText(new Date('2026-03-04T05:06:07.089Z'))).toBe('2026-03-04 05:06:07.089');
  });
});

describe('translateSql and aliases used again', () => {
  it('quotes a camelCase alias wherever the query uses it, not a column of the same letters after a dot', () => {
    expect(translateSql('SELECT COALESCE(t.number, l.to_number) AS toNumber FROM l ORDER BY l.kind, toNumber')).toBe('SELECT COALESCE(t.number, l.to_number) AS "toNumber" FROM l ORDER BY l.kind, "toNumber"');
    expect(translateSql('SELECT x.partId, y AS partId FROM x')).toBe('SELECT x.partId, y AS "partId" FROM x');
  });
});
