import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Sales (issue 12): the shop's sales settings (pricing rules as JSON, tax rounding, extra named
 * tax rates), list prices per part, invoices and credit notes with their lines, payments, card
 * checkout sessions, and the gap-free number counters (one row per shop and series, updated in
 * the issuing transaction). Every table is shop-owned; children point at their parent through
 * (shop_id, parent_id). Amounts are integer (bigint) minor units; quantities decimal text.
 */
export class Sales1765700000000Pg implements MigrationInterface {
  name = 'Sales1765700000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE sales_settings (
        shop_id varchar(36) PRIMARY KEY NOT NULL REFERENCES shops (id),
        pricing_rules text NOT NULL,
        tax_rounding varchar(20) NOT NULL CHECK (tax_rounding IN ('per-line', 'per-document')),
        updated_at text NOT NULL
      )`);
    await queryRunner.query(`
      CREATE TABLE sales_tax_rates (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        name varchar(40) NOT NULL CHECK (length(name) > 0),
        rate_percent numeric(6, 3) NOT NULL CHECK (rate_percent >= 0 AND rate_percent <= 100),
        position bigint NOT NULL,
        UNIQUE (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_sales_tax_rates_shop_id ON sales_tax_rates (shop_id)`);
    await queryRunner.query(`
      CREATE TABLE part_prices (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        list_price_minor bigint NULL CHECK (list_price_minor IS NULL OR list_price_minor >= 0),
        updated_at text NOT NULL,
        PRIMARY KEY (shop_id, part_id),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await queryRunner.query(`
      CREATE TABLE invoice_counters (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        series varchar(20) NOT NULL CHECK (series IN ('invoice', 'credit_note')),
        last_number bigint NOT NULL CHECK (last_number >= 0),
        PRIMARY KEY (shop_id, series)
      )`);
    await queryRunner.query(`
      CREATE TABLE invoices (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        kind varchar(20) NOT NULL CHECK (kind IN ('invoice', 'credit_note')),
        status varchar(10) NOT NULL CHECK (status IN ('draft', 'issued')),
        number bigint NULL CHECK (number IS NULL OR number > 0),
        source varchar(10) NOT NULL CHECK (source IN ('job', 'counter', 'vehicle', 'manual', 'credit')),
        customer_id varchar(36) NULL,
        customer_name varchar(120) NOT NULL,
        customer_email varchar(254) NULL,
        customer_address varchar(500) NULL,
        notes varchar(1000) NULL,
        job_id varchar(36) NULL,
        vehicle_id varchar(36) NULL,
        credited_invoice_id varchar(36) NULL,
        credit_reason varchar(500) NULL,
        currency varchar(3) NOT NULL,
        tax_rounding varchar(20) NOT NULL CHECK (tax_rounding IN ('per-line', 'per-document')),
        net_minor bigint NOT NULL,
        tax_minor bigint NOT NULL,
        gross_minor bigint NOT NULL,
        tax_by_rate text NOT NULL,
        pay_token varchar(64) NULL UNIQUE,
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        updated_at text NOT NULL,
        issued_at text NULL,
        emailed_at text NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, kind, number),
        CHECK ((status = 'draft') = (number IS NULL)),
        CHECK ((kind = 'credit_note') = (credited_invoice_id IS NOT NULL)),
        FOREIGN KEY (shop_id, customer_id) REFERENCES customers (shop_id, id),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id),
        FOREIGN KEY (shop_id, credited_invoice_id) REFERENCES invoices (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_invoices_shop_id ON invoices (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_invoices_shop_status ON invoices (shop_id, status)`);
    await queryRunner.query(`CREATE INDEX idx_invoices_shop_customer ON invoices (shop_id, customer_id)`);
    await queryRunner.query(`CREATE INDEX idx_invoices_shop_job ON invoices (shop_id, job_id)`);
    await queryRunner.query(`
      CREATE TABLE invoice_lines (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        invoice_id varchar(36) NOT NULL,
        position bigint NOT NULL,
        kind varchar(10) NOT NULL CHECK (kind IN ('part', 'labour', 'vehicle', 'other')),
        part_id varchar(36) NULL,
        description varchar(200) NOT NULL,
        quantity varchar(20) NOT NULL,
        unit_price_minor bigint NOT NULL CHECK (unit_price_minor >= 0),
        listed_unit_price_minor bigint NULL,
        unit_cost_minor bigint NULL,
        discount_percent numeric(6, 3) NOT NULL DEFAULT 0,
        tax_rate_percent numeric(6, 3) NOT NULL,
        net_minor bigint NOT NULL,
        tax_minor bigint NOT NULL,
        gross_minor bigint NOT NULL,
        credited_line_id varchar(36) NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, invoice_id) REFERENCES invoices (shop_id, id) ON DELETE CASCADE,
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, credited_line_id) REFERENCES invoice_lines (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_invoice_lines_shop_invoice ON invoice_lines (shop_id, invoice_id)`);
    await queryRunner.query(`
      CREATE TABLE invoice_payments (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        invoice_id varchar(36) NOT NULL,
        method varchar(20) NOT NULL CHECK (method IN ('cash', 'bank_transfer', 'card')),
        amount_minor bigint NOT NULL CHECK (amount_minor > 0),
        received_on varchar(10) NOT NULL,
        reference varchar(120) NULL,
        stripe_session_id varchar(255) NULL UNIQUE,
        recorded_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, invoice_id) REFERENCES invoices (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_invoice_payments_shop_invoice ON invoice_payments (shop_id, invoice_id)`);
    await queryRunner.query(`
      CREATE TABLE invoice_card_sessions (
        id varchar(255) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        invoice_id varchar(36) NOT NULL,
        amount_minor bigint NOT NULL CHECK (amount_minor > 0),
        status varchar(10) NOT NULL CHECK (status IN ('open', 'paid', 'expired')),
        created_at text NOT NULL,
        completed_at text NULL,
        FOREIGN KEY (shop_id, invoice_id) REFERENCES invoices (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_invoice_card_sessions_shop_invoice ON invoice_card_sessions (shop_id, invoice_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['invoice_card_sessions', 'invoice_payments', 'invoice_lines', 'invoices', 'invoice_counters', 'part_prices', 'sales_tax_rates', 'sales_settings']) {
      await queryRunner.query(`DROP TABLE ${table}`);
    }
  }
}
