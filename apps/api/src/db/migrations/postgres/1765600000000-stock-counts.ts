import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Stock counts (issue 7): a count (its scope, the ledger position it froze at, who started and
 * closed it) and its lines (part × bin × condition) with the quantity frozen at the start and what
 * was counted, by whom and when. Lines point at their count, part and bin through `(shop_id, …)`
 * composite keys, so a line can never cross shops.
 *
 * Also supplier barcodes (issue 7): GTINs (EAN/UPC) attached to parts, each at most once per shop,
 * matched on the 14-digit form (`gtin14`, zero-padded) so a UPC-A and its EAN-13 form are one code.
 */
export class StockCounts1765600000000Pg implements MigrationInterface {
  name = 'StockCounts1765600000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const conditions = `('new', 'nos', 'used_good', 'used_fair', 'reconditioned', 'core')`;
    await queryRunner.query(`
      CREATE TABLE stock_counts (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        number bigint NOT NULL CHECK (number > 0),
        status varchar(10) NOT NULL CHECK (status IN ('open', 'posted', 'abandoned')),
        scope_kind varchar(10) NOT NULL CHECK (scope_kind IN ('bins', 'categories')),
        scope_json text NOT NULL,
        note varchar(500) NULL,
        freeze_seq bigint NOT NULL CHECK (freeze_seq >= 0),
        started_at text NOT NULL,
        started_by_user_id varchar(36) NULL,
        closed_at text NULL,
        closed_by_user_id varchar(36) NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, number),
        CHECK ((status = 'open') = (closed_at IS NULL))
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_counts_shop_id ON stock_counts (shop_id, status)`);

    await queryRunner.query(`
      CREATE TABLE stock_count_lines (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        count_id varchar(36) NOT NULL,
        part_id varchar(36) NOT NULL,
        bin_id varchar(36) NOT NULL,
        condition varchar(20) NOT NULL CHECK (condition IN ${conditions}),
        frozen_quantity bigint NOT NULL CHECK (frozen_quantity >= 0),
        added bigint NOT NULL DEFAULT 0,
        counted_quantity bigint NULL CHECK (counted_quantity >= 0),
        moved_since_freeze bigint NULL,
        counted_at text NULL,
        counted_by_user_id varchar(36) NULL,
        posted_movement_id varchar(36) NULL,
        UNIQUE (shop_id, count_id, part_id, bin_id, condition),
        CHECK ((counted_quantity IS NULL) = (counted_at IS NULL)),
        FOREIGN KEY (shop_id, count_id) REFERENCES stock_counts (shop_id, id),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_count_lines_count ON stock_count_lines (shop_id, count_id)`);

    await queryRunner.query(`
      CREATE TABLE part_barcodes (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        code varchar(14) NOT NULL,
        gtin14 varchar(14) NOT NULL CHECK (length(gtin14) = 14),
        created_at text NOT NULL,
        created_by_user_id varchar(36) NULL,
        UNIQUE (shop_id, gtin14),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_part_barcodes_part ON part_barcodes (shop_id, part_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE part_barcodes`);
    await queryRunner.query(`DROP TABLE stock_count_lines`);
    await queryRunner.query(`DROP TABLE stock_counts`);
  }
}
