import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * The catalogue (issue 4): parts, the numbers suppliers use for them, links between numbers and
 * fitments. Children refer to parts through `(shop_id, part_id)` → parts `(shop_id, id)`, so the
 * database itself refuses a link or fitment across shops.
 */
export class Catalogue1764720000000Pg implements MigrationInterface {
  name = 'Catalogue1764720000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE parts (
        id varchar(36) PRIMARY KEY NOT NULL,
        -- SQLite's implicit rowid made explicit: parts are read in insertion order, and part_search rows are keyed by it.
        rowid bigint GENERATED ALWAYS AS IDENTITY UNIQUE,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        number varchar(40) NOT NULL,
        key varchar(40) NOT NULL CHECK (key <> ''),
        description varchar(200) NOT NULL,
        origin varchar(20) NOT NULL CHECK (origin IN ('genuine', 'reproduction', 'pattern')),
        maker varchar(80) NULL,
        category varchar(60) NULL,
        unit varchar(20) NOT NULL,
        status varchar(20) NOT NULL CHECK (status IN ('available', 'nla')),
        notes varchar(2000) NULL,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, key),
        UNIQUE (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_parts_shop_id ON parts (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_parts_shop_category ON parts (shop_id, category)`);

    await queryRunner.query(`
      CREATE TABLE part_supplier_numbers (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        number varchar(40) NOT NULL,
        key varchar(40) NOT NULL CHECK (key <> ''),
        PRIMARY KEY (shop_id, part_id, key),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id) ON DELETE CASCADE
      )`);
    await queryRunner.query(`CREATE INDEX idx_part_supplier_numbers_key ON part_supplier_numbers (shop_id, key)`);

    await queryRunner.query(`
      CREATE TABLE part_links (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        from_part_id varchar(36) NOT NULL,
        kind varchar(20) NOT NULL CHECK (kind IN ('replaced_by', 'kit_contains', 'equivalent')),
        to_part_id varchar(36) NULL,
        to_number varchar(40) NOT NULL,
        to_key varchar(40) NOT NULL CHECK (to_key <> ''),
        quantity double precision NOT NULL CHECK (quantity > 0),
        interchange varchar(20) NOT NULL CHECK (interchange IN ('both', 'one_way', 'with_changes')),
        effective_date varchar(10) NULL,
        source_reference varchar(120) NULL,
        note varchar(500) NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, from_part_id, kind, to_key),
        CHECK (kind <> 'equivalent' OR interchange <> 'with_changes'),
        FOREIGN KEY (shop_id, from_part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, to_part_id) REFERENCES parts (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_part_links_shop_id ON part_links (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_part_links_to ON part_links (shop_id, to_part_id)`);
    await queryRunner.query(`CREATE INDEX idx_part_links_to_key ON part_links (shop_id, to_key)`);

    await queryRunner.query(`
      CREATE TABLE fitments (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        marque varchar(60) NOT NULL,
        model varchar(80) NOT NULL,
        year_from bigint NULL,
        year_to bigint NULL,
        frame_from varchar(40) NULL,
        frame_to varchar(40) NULL,
        UNIQUE (shop_id, id),
        CHECK (year_from IS NULL OR year_to IS NULL OR year_from <= year_to),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_fitments_shop_part ON fitments (shop_id, part_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE fitments`);
    await queryRunner.query(`DROP TABLE part_links`);
    await queryRunner.query(`DROP TABLE part_supplier_numbers`);
    await queryRunner.query(`DROP TABLE parts`);
  }
}
