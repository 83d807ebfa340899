import type { MigrationInterface, QueryRunner } from 'typeorm';

/** O→0 and I→1, as `foldLookalikes` in libs/domain does: the index holds folded keys. */
const fold = (column: string) => `replace(replace(${column}, 'O', '0'), 'I', '1')`;

/**
 * Every number a part answers to, folded, space-separated and space-padded (" 713456 12345 ", so a
 * LIKE pattern can anchor on one whole key): its own key, its supplier numbers and the numbers of
 * equivalents that are not parts of their own. `p` is the part row alias.
 */
const keysOf = (p: string) => `' ' || ${fold(`${p}.key`)}
  || COALESCE(' ' || (SELECT group_concat(${fold('s.key')}, ' ') FROM part_supplier_numbers s WHERE s.shop_id = ${p}.shop_id AND s.part_id = ${p}.id), '')
  || COALESCE(' ' || (SELECT group_concat(${fold('l.to_key')}, ' ') FROM part_links l WHERE l.shop_id = ${p}.shop_id AND l.from_part_id = ${p}.id AND l.kind = 'equivalent' AND l.to_part_id IS NULL), '') || ' '`;

/** Recomputes the `keys` of one part, named by `shopId` and `partId` expressions. */
const refresh = (shopId: string, partId: string) =>
  `UPDATE part_search SET keys = (SELECT ${keysOf('p')} FROM parts p WHERE p.rowid = part_search.rowid)
   WHERE rowid = (SELECT rowid FROM parts WHERE shop_id = ${shopId} AND id = ${partId});`;

/**
 * Lookup (issue 5): an FTS5 trigram index over each part's numbers and description. Its rowid is
 * the part's rowid; triggers keep it in step with parts, supplier numbers and equivalent links in
 * the same transaction as the write, whoever writes (services, imports, seeds). Only the lookup
 * module's PartSearchIndex reads it, so PostgreSQL (pg_trgm) can take its place behind that interface.
 */
export class PartSearch1764900000000 implements MigrationInterface {
  name = 'PartSearch1764900000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE VIRTUAL TABLE part_search USING fts5(shop_id UNINDEXED, part_id UNINDEXED, keys, description, tokenize = 'trigram')`);
    await queryRunner.query(`INSERT INTO part_search (rowid, shop_id, part_id, keys, description) SELECT p.rowid, p.shop_id, p.id, ${keysOf('p')}, p.description FROM parts p`);

    await queryRunner.query(`CREATE TRIGGER part_search_parts_insert AFTER INSERT ON parts BEGIN
      INSERT INTO part_search (rowid, shop_id, part_id, keys, description) SELECT p.rowid, p.shop_id, p.id, ${keysOf('p')}, p.description FROM parts p WHERE p.rowid = new.rowid;
    END`);
    await queryRunner.query(`CREATE TRIGGER part_search_parts_update AFTER UPDATE OF key, description ON parts BEGIN
      UPDATE part_search SET keys = (SELECT ${keysOf('p')} FROM parts p WHERE p.rowid = new.rowid), description = new.description WHERE rowid = new.rowid;
    END`);
    await queryRunner.query(`CREATE TRIGGER part_search_parts_delete AFTER DELETE ON parts BEGIN
      DELETE FROM part_search WHERE rowid = old.rowid;
    END`);

    await queryRunner.query(`CREATE TRIGGER part_search_supplier_insert AFTER INSERT ON part_supplier_numbers BEGIN ${refresh('new.shop_id', 'new.part_id')} END`);
    await queryRunner.query(`CREATE TRIGGER part_search_supplier_delete AFTER DELETE ON part_supplier_numbers BEGIN ${refresh('old.shop_id', 'old.part_id')} END`);
    await queryRunner.query(`CREATE TRIGGER part_search_supplier_update AFTER UPDATE ON part_supplier_numbers BEGIN ${refresh('old.shop_id', 'old.part_id')} ${refresh('new.shop_id', 'new.part_id')} END`);

    await queryRunner.query(`CREATE TRIGGER part_search_links_insert AFTER INSERT ON part_links WHEN new.kind = 'equivalent' BEGIN ${refresh('new.shop_id', 'new.from_part_id')} END`);
    await queryRunner.query(`CREATE TRIGGER part_search_links_delete AFTER DELETE ON part_links WHEN old.kind = 'equivalent' BEGIN ${refresh('old.shop_id', 'old.from_part_id')} END`);
    await queryRunner.query(
      `CREATE TRIGGER part_search_links_update AFTER UPDATE ON part_links WHEN old.kind = 'equivalent' OR new.kind = 'equivalent' BEGIN ${refresh('old.shop_id', 'old.from_part_id')} ${refresh('new.shop_id', 'new.from_part_id')} END`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const name of ['parts_insert', 'parts_update', 'parts_delete', 'supplier_insert', 'supplier_delete', 'supplier_update', 'links_insert', 'links_delete', 'links_update']) {
      await queryRunner.query(`DROP TRIGGER IF EXISTS part_search_${name}`);
    }
    await queryRunner.query(`DROP TABLE IF EXISTS part_search`);
  }
}
