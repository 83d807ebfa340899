import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Estimates and consignment settlements (issue 12). Estimates belong to a job; each revision is a
 * new row (number, version) whose predecessor becomes `superseded`. Approval links are random
 * tokens stored only as their SHA-256 hash, with an expiry and a used-at stamp (single use).
 * Consignment terms and settlements are one per consigned vehicle. Every table is shop-owned
 * (shop_id, index, FK) and children point at parents through (shop_id, parent_id).
 */
export class EstimatesAndConsignment1765800000000Pg implements MigrationInterface {
  name = 'EstimatesAndConsignment1765800000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE estimates (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        number bigint NOT NULL CHECK (number > 0),
        version bigint NOT NULL CHECK (version > 0),
        job_id varchar(36) NOT NULL,
        customer_id varchar(36) NULL,
        status varchar(12) NOT NULL CHECK (status IN ('draft', 'sent', 'approved', 'declined', 'superseded')),
        currency varchar(3) NOT NULL,
        tax_rounding varchar(20) NOT NULL CHECK (tax_rounding IN ('per-line', 'per-document')),
        note varchar(1000) NULL,
        net_minor bigint NOT NULL,
        tax_minor bigint NOT NULL,
        gross_minor bigint NOT NULL,
        tax_by_rate text NOT NULL,
        sent_at text NULL,
        sent_to varchar(254) NULL,
        decided_at text NULL,
        decided_by_name varchar(120) NULL,
        approved_amount_minor bigint NULL,
        decline_reason varchar(1000) NULL,
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, number, version),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, customer_id) REFERENCES customers (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_estimates_shop_id ON estimates (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_estimates_shop_id_job ON estimates (shop_id, job_id)`);
    await queryRunner.query(`
      CREATE TABLE estimate_lines (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        estimate_id varchar(36) NOT NULL,
        position bigint NOT NULL,
        kind varchar(10) NOT NULL CHECK (kind IN ('part', 'labour', 'other')),
        part_id varchar(36) NULL,
        description varchar(200) NOT NULL,
        quantity varchar(16) NOT NULL,
        unit_price_minor bigint NOT NULL,
        price_basis varchar(20) NOT NULL,
        tax_rate_percent double precision NOT NULL,
        net_minor bigint NOT NULL,
        tax_minor bigint NOT NULL,
        gross_minor bigint NOT NULL,
        FOREIGN KEY (shop_id, estimate_id) REFERENCES estimates (shop_id, id),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_estimate_lines_shop_id ON estimate_lines (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_estimate_lines_estimate ON estimate_lines (shop_id, estimate_id)`);
    await queryRunner.query(`
      CREATE TABLE estimate_links (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        estimate_id varchar(36) NOT NULL,
        token_hash varchar(64) NOT NULL UNIQUE,
        expires_at text NOT NULL,
        used_at text NULL,
        revoked_at text NULL,
        created_at text NOT NULL,
        FOREIGN KEY (shop_id, estimate_id) REFERENCES estimates (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_estimate_links_shop_id ON estimate_links (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_estimate_links_estimate ON estimate_links (shop_id, estimate_id)`);
    await queryRunner.query(`
      CREATE TABLE consignment_terms (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        vehicle_id varchar(36) NOT NULL,
        commission_kind varchar(10) NOT NULL CHECK (commission_kind IN ('percent', 'fixed')),
        commission_milli_percent bigint NULL CHECK (commission_milli_percent BETWEEN 0 AND 100000),
        commission_fixed_minor bigint NULL CHECK (commission_fixed_minor >= 0),
        agreed_on varchar(10) NOT NULL,
        note varchar(1000) NULL,
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, vehicle_id),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_consignment_terms_shop_id ON consignment_terms (shop_id)`);
    await queryRunner.query(`
      CREATE TABLE consignment_settlements (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        number bigint NOT NULL CHECK (number > 0),
        vehicle_id varchar(36) NOT NULL,
        consignor_customer_id varchar(36) NULL,
        sold_on varchar(10) NOT NULL,
        currency varchar(3) NOT NULL,
        sale_price_minor bigint NOT NULL CHECK (sale_price_minor > 0),
        commission_kind varchar(10) NOT NULL CHECK (commission_kind IN ('percent', 'fixed')),
        commission_milli_percent bigint NULL,
        commission_fixed_minor bigint NULL,
        commission_minor bigint NOT NULL,
        work text NOT NULL,
        work_minor bigint NOT NULL,
        payout_minor bigint NOT NULL,
        note varchar(1000) NULL,
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        paid_on varchar(10) NULL,
        payout_method varchar(20) NULL CHECK (payout_method IN ('bank_transfer', 'cheque', 'cash')),
        payout_reference varchar(120) NULL,
        payout_recorded_by_user_id varchar(36) NULL REFERENCES users (id),
        payout_recorded_at text NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, number),
        UNIQUE (shop_id, vehicle_id),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id),
        FOREIGN KEY (shop_id, consignor_customer_id) REFERENCES customers (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_consignment_settlements_shop_id ON consignment_settlements (shop_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['consignment_settlements', 'consignment_terms', 'estimate_links', 'estimate_lines', 'estimates']) {
      await queryRunner.query(`DROP TABLE ${table}`);
    }
  }
}
