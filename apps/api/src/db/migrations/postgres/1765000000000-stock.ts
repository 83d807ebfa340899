import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Stock (issue 6): bins, stock lines (cached balances per part × bin × condition), valuation pools
 * (cached quantity and value per part × condition), serialised items, holds and the append-only
 * movement ledger. Children point at their parents through `(shop_id, …_id)` composite keys, so
 * the database refuses a movement, hold or line that crosses shops. Triggers refuse any UPDATE or
 * DELETE of a movement: corrections are new movements.
 */
export class Stock1765000000000Pg implements MigrationInterface {
  name = 'Stock1765000000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const conditions = `('new', 'nos', 'used_good', 'used_fair', 'reconditioned', 'core')`;
    await queryRunner.query(`
      CREATE TABLE stock_bins (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        code varchar(20) NOT NULL,
        code_key varchar(20) NOT NULL CHECK (code_key <> ''),
        description varchar(200) NULL,
        active bigint NOT NULL DEFAULT 1,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, code_key)
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_bins_shop_id ON stock_bins (shop_id)`);

    await queryRunner.query(`
      CREATE TABLE stock_lines (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        bin_id varchar(36) NOT NULL,
        condition varchar(20) NOT NULL CHECK (condition IN ${conditions}),
        on_hand bigint NOT NULL CHECK (on_hand >= 0),
        held bigint NOT NULL CHECK (held >= 0),
        updated_at text NOT NULL,
        PRIMARY KEY (shop_id, part_id, bin_id, condition),
        CHECK (held <= on_hand),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_lines_bin ON stock_lines (shop_id, bin_id)`);

    await queryRunner.query(`
      CREATE TABLE stock_pools (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        condition varchar(20) NOT NULL CHECK (condition IN ${conditions}),
        method varchar(10) NOT NULL CHECK (method IN ('average', 'specific')),
        quantity bigint NOT NULL CHECK (quantity >= 0),
        value_minor bigint NOT NULL CHECK (value_minor >= 0),
        updated_at text NOT NULL,
        PRIMARY KEY (shop_id, part_id, condition),
        CHECK (quantity > 0 OR value_minor = 0),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);

    await queryRunner.query(`
      CREATE TABLE stock_serials (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        serial varchar(40) NOT NULL,
        serial_key varchar(40) NOT NULL CHECK (serial_key <> ''),
        condition varchar(20) NOT NULL CHECK (condition IN ${conditions}),
        bin_id varchar(36) NULL,
        cost_minor bigint NOT NULL CHECK (cost_minor >= 0),
        in_stock bigint NOT NULL,
        received_at text NOT NULL,
        UNIQUE (shop_id, id),
        CHECK (in_stock = 0 OR bin_id IS NOT NULL),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_serials_part ON stock_serials (shop_id, part_id)`);
    // One item with a number on the shelf at a time; the same number may come back after it left.
    await queryRunner.query(`CREATE UNIQUE INDEX idx_stock_serials_in_stock ON stock_serials (shop_id, part_id, serial_key) WHERE in_stock = 1`);

    await queryRunner.query(`
      CREATE TABLE stock_holds (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        bin_id varchar(36) NOT NULL,
        condition varchar(20) NOT NULL CHECK (condition IN ${conditions}),
        quantity bigint NOT NULL CHECK (quantity >= 0),
        purpose varchar(200) NOT NULL,
        job_id varchar(36) NULL,
        status varchar(10) NOT NULL CHECK (status IN ('active', 'released', 'issued')),
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        closed_at text NULL,
        UNIQUE (shop_id, id),
        CHECK (status <> 'active' OR quantity > 0),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_holds_line ON stock_holds (shop_id, part_id, status)`);
    await queryRunner.query(`CREATE INDEX idx_stock_holds_job ON stock_holds (shop_id, job_id)`);

    await queryRunner.query(`
      CREATE TABLE stock_movements (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        seq bigint NOT NULL CHECK (seq > 0),
        kind varchar(10) NOT NULL CHECK (kind IN ('received', 'issued', 'returned', 'adjusted', 'moved', 'counted')),
        part_id varchar(36) NOT NULL,
        bin_id varchar(36) NOT NULL,
        to_bin_id varchar(36) NULL,
        condition varchar(20) NOT NULL CHECK (condition IN ${conditions}),
        quantity_delta bigint NOT NULL,
        counted_quantity bigint NULL CHECK (counted_quantity IS NULL OR counted_quantity >= 0),
        unit_cost_minor bigint NULL CHECK (unit_cost_minor IS NULL OR unit_cost_minor >= 0),
        value_change_minor bigint NOT NULL,
        serial_id varchar(36) NULL,
        reason varchar(200) NULL,
        reference varchar(120) NULL,
        note varchar(500) NULL,
        hold_id varchar(36) NULL,
        job_id varchar(36) NULL,
        occurred_at text NOT NULL,
        recorded_at text NOT NULL,
        user_id varchar(36) NULL REFERENCES users (id),
        api_key_id varchar(36) NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, seq),
        CHECK (kind <> 'moved' OR (to_bin_id IS NOT NULL AND to_bin_id <> bin_id AND quantity_delta < 0 AND value_change_minor = 0)),
        CHECK (kind = 'moved' OR to_bin_id IS NULL),
        CHECK (kind <> 'adjusted' OR (reason IS NOT NULL AND quantity_delta <> 0)),
        CHECK (kind <> 'counted' OR counted_quantity IS NOT NULL),
        CHECK (kind NOT IN ('received', 'returned') OR quantity_delta > 0),
        CHECK (kind <> 'issued' OR quantity_delta < 0),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id),
        FOREIGN KEY (shop_id, to_bin_id) REFERENCES stock_bins (shop_id, id),
        FOREIGN KEY (shop_id, serial_id) REFERENCES stock_serials (shop_id, id),
        FOREIGN KEY (shop_id, hold_id) REFERENCES stock_holds (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_stock_movements_part ON stock_movements (shop_id, part_id, seq)`);
    await queryRunner.query(`CREATE INDEX idx_stock_movements_bin ON stock_movements (shop_id, bin_id)`);
    await queryRunner.query(`CREATE INDEX idx_stock_movements_to_bin ON stock_movements (shop_id, to_bin_id)`);
    await queryRunner.query(`CREATE INDEX idx_stock_movements_occurred ON stock_movements (shop_id, occurred_at)`);
    // Append-only: a wrong movement is corrected by another movement, never edited away.
    await queryRunner.query(`CREATE TRIGGER stock_movements_no_update BEFORE UPDATE ON stock_movements FOR EACH ROW EXECUTE FUNCTION tappet_refuse_change('stock movements are append-only')`);
    await queryRunner.query(`CREATE TRIGGER stock_movements_no_delete BEFORE DELETE ON stock_movements FOR EACH ROW EXECUTE FUNCTION tappet_refuse_change('stock movements are append-only')`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER stock_movements_no_delete ON stock_movements`);
    await queryRunner.query(`DROP TRIGGER stock_movements_no_update ON stock_movements`);
    await queryRunner.query(`DROP TABLE stock_movements`);
    await queryRunner.query(`DROP TABLE stock_holds`);
    await queryRunner.query(`DROP TABLE stock_serials`);
    await queryRunner.query(`DROP TABLE stock_pools`);
    await queryRunner.query(`DROP TABLE stock_lines`);
    await queryRunner.query(`DROP TABLE stock_bins`);
  }
}
