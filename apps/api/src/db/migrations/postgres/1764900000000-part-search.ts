import type { MigrationInterface, QueryRunner } from 'typeorm';

/** O→0 and I→1, as `foldLookalikes` in libs/domain does: the index holds folded keys. */
const fold = (column: string) => `replace(replace(${column}, 'O', '0'), 'I', '1')`;

/**
 * Every number a part answers to, folded, space-separated and space-padded (" 713456 12345 "), in
 * the order the SQLite twin's group_concat reads them (supplier numbers by key, then equivalents by
 * key). `p` is the part row alias.
 */
const keysOf = (p: string) => `' ' || ${fold(`${p}.key`)}
  || COALESCE(' ' || (SELECT string_agg(${fold('s.key')}, ' ' ORDER BY s.key) FROM part_supplier_numbers s WHERE s.shop_id = ${p}.shop_id AND s.part_id = ${p}.id), '')
  || COALESCE(' ' || (SELECT string_agg(${fold('l.to_key')}, ' ' ORDER BY l.to_key) FROM part_links l WHERE l.shop_id = ${p}.shop_id AND l.from_part_id = ${p}.id AND l.kind = 'equivalent' AND l.to_part_id IS NULL), '') || ' '`;

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Lookup (issue 5): where SQLite has an FTS5 trigram table, PostgreSQL has a plain `part_search`
 * table with pg_trgm GIN indexes on its keys and description (they serve LIKE '%…%' and trigram
 * similarity). Its `rowid` is the part's `rowid` (an identity column the catalogue twin gives
 * parts, so `ORDER BY rowid` reads parts in insertion order as on SQLite). plpgsql triggers keep
 * it in step with parts, supplier numbers and equivalent links in the writing transaction.
 */
export class PartSearch1764900000000Pg implements MigrationInterface {
  name = 'PartSearch1764900000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    // pg_trgm is a trusted extension (PostgreSQL 13+): the database owner may create it.
    await queryRunner.query(`CREATE EXTENSION IF NOT EXISTS pg_trgm`);
    await queryRunner.query(`
      CREATE TABLE part_search (
        rowid bigint PRIMARY KEY,
        shop_id varchar(36) NOT NULL,
        part_id varchar(36) NOT NULL,
        keys text NOT NULL,
        description text NOT NULL
      )`);
    await queryRunner.query(`CREATE INDEX idx_part_search_shop ON part_search (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_part_search_keys ON part_search USING gin (keys gin_trgm_ops)`);
    await queryRunner.query(`CREATE INDEX idx_part_search_description ON part_search USING gin (description gin_trgm_ops)`);
    await queryRunner.query(`INSERT INTO part_search (rowid, shop_id, part_id, keys, description) SELECT p.rowid, p.shop_id, p.id, ${keysOf('p')}, p.description FROM parts p`);

    await queryRunner.query(`
      CREATE FUNCTION part_search_refresh(shop varchar, part varchar) RETURNS void LANGUAGE sql AS $$
        UPDATE part_search SET keys = (SELECT ${keysOf('p')} FROM parts p WHERE p.rowid = part_search.rowid)
        WHERE rowid = (SELECT rowid FROM parts WHERE shop_id = shop AND id = part)
      $$`);
    await queryRunner.query(`
      CREATE FUNCTION part_search_parts_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'INSERT' THEN
          INSERT INTO part_search (rowid, shop_id, part_id, keys, description) SELECT p.rowid, p.shop_id, p.id, ${keysOf('p')}, p.description FROM parts p WHERE p.rowid = NEW.rowid;
        ELSIF TG_OP = 'UPDATE' THEN
          UPDATE part_search SET keys = (SELECT ${keysOf('p')} FROM parts p WHERE p.rowid = NEW.rowid), description = NEW.description WHERE rowid = NEW.rowid;
        ELSE
          DELETE FROM part_search WHERE rowid = OLD.rowid;
        END IF;
        RETURN NULL;
      END $$`);
    await queryRunner.query(`
      CREATE FUNCTION part_search_numbers_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP IN ('UPDATE', 'DELETE') THEN PERFORM part_search_refresh(OLD.shop_id, OLD.part_id); END IF;
        IF TG_OP IN ('UPDATE', 'INSERT') THEN PERFORM part_search_refresh(NEW.shop_id, NEW.part_id); END IF;
        RETURN NULL;
      END $$`);
    await queryRunner.query(`
      CREATE FUNCTION part_search_links_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP IN ('UPDATE', 'DELETE') AND OLD.kind = 'equivalent' THEN PERFORM part_search_refresh(OLD.shop_id, OLD.from_part_id); END IF;
        IF TG_OP IN ('UPDATE', 'INSERT') AND NEW.kind = 'equivalent' THEN PERFORM part_search_refresh(NEW.shop_id, NEW.from_part_id); END IF;
        RETURN NULL;
      END $$`);

    await queryRunner.query(`CREATE TRIGGER part_search_parts_insert AFTER INSERT ON parts FOR EACH ROW EXECUTE FUNCTION part_search_parts_change()`);
    await queryRunner.query(`CREATE TRIGGER part_search_parts_update AFTER UPDATE OF key, description ON parts FOR EACH ROW EXECUTE FUNCTION part_search_parts_change()`);
    await queryRunner.query(`CREATE TRIGGER part_search_parts_delete AFTER DELETE ON parts FOR EACH ROW EXECUTE FUNCTION part_search_parts_change()`);
    for (const op of ['insert', 'update', 'delete']) {
      await queryRunner.query(`CREATE TRIGGER part_search_supplier_${op} AFTER ${op.toUpperCase()} ON part_supplier_numbers FOR EACH ROW EXECUTE FUNCTION part_search_numbers_change()`);
      await queryRunner.query(`CREATE TRIGGER part_search_links_${op} AFTER ${op.toUpperCase()} ON part_links FOR EACH ROW EXECUTE FUNCTION part_search_links_change()`);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [table, names] of [['parts', ['parts_insert', 'parts_update', 'parts_delete']], ['part_supplier_numbers', ['supplier_insert', 'supplier_update', 'supplier_delete']], ['part_links', ['links_insert', 'links_update', 'links_delete']]] as const) {
      for (const name of names) await queryRunner.query(`DROP TRIGGER IF EXISTS part_search_${name} ON ${table}`);
    }
    for (const fn of ['part_search_parts_change', 'part_search_numbers_change', 'part_search_links_change', 'part_search_refresh']) await queryRunner.query(`DROP FUNCTION IF EXISTS ${fn}`);
    await queryRunner.query(`DROP TABLE IF EXISTS part_search`);
  }
}
