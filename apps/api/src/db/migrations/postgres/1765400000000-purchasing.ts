import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Purchasing (issue 8): suppliers, their listings of parts, per-part purchasing choices (preferred
 * supplier, manual min/max), the shop's reorder settings, purchase orders with lines, receipts,
 * returns to suppliers and core deposits. Children point at their parents through
 * `(shop_id, …_id)` composite keys, so the database refuses a link that crosses shops.
 */
export class Purchasing1765400000000Pg implements MigrationInterface {
  name = 'Purchasing1765400000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const q = (sql: string) => queryRunner.query(sql);
    await q(`
      CREATE TABLE suppliers (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        name varchar(120) NOT NULL,
        name_key varchar(120) NOT NULL CHECK (name_key <> ''),
        email varchar(254) NULL,
        currency varchar(3) NOT NULL,
        lead_time_days bigint NOT NULL CHECK (lead_time_days >= 0),
        lead_time_sd_days double precision NULL CHECK (lead_time_sd_days IS NULL OR lead_time_sd_days >= 0),
        min_order_value_minor bigint NOT NULL DEFAULT 0 CHECK (min_order_value_minor >= 0),
        notes varchar(1000) NULL,
        active bigint NOT NULL DEFAULT 1,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, name_key)
      )`);
    await q(`CREATE INDEX idx_suppliers_shop_id ON suppliers (shop_id)`);

    await q(`
      CREATE TABLE supplier_listings (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        supplier_id varchar(36) NOT NULL,
        part_id varchar(36) NOT NULL,
        supplier_number varchar(40) NULL,
        price_minor bigint NOT NULL CHECK (price_minor >= 0),
        pack_size bigint NOT NULL DEFAULT 1 CHECK (pack_size >= 1),
        min_order_qty bigint NOT NULL DEFAULT 0 CHECK (min_order_qty >= 0),
        lead_time_days bigint NULL CHECK (lead_time_days IS NULL OR lead_time_days >= 0),
        last_paid_unit_minor bigint NULL,
        last_paid_at text NULL,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, supplier_id, part_id),
        FOREIGN KEY (shop_id, supplier_id) REFERENCES suppliers (shop_id, id),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await q(`CREATE INDEX idx_supplier_listings_part ON supplier_listings (shop_id, part_id)`);

    await q(`
      CREATE TABLE part_purchasing (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        part_id varchar(36) NOT NULL,
        preferred_supplier_id varchar(36) NULL,
        min_qty bigint NULL CHECK (min_qty IS NULL OR min_qty >= 0),
        max_qty bigint NULL CHECK (max_qty IS NULL OR max_qty >= 0),
        updated_at text NOT NULL,
        PRIMARY KEY (shop_id, part_id),
        CHECK (min_qty IS NULL OR max_qty IS NULL OR min_qty <= max_qty),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, preferred_supplier_id) REFERENCES suppliers (shop_id, id)
      )`);

    await q(`
      CREATE TABLE purchasing_settings (
        shop_id varchar(36) PRIMARY KEY NOT NULL REFERENCES shops (id),
        demand_window_days bigint NOT NULL CHECK (demand_window_days BETWEEN 7 AND 1095),
        dead_stock_days bigint NOT NULL CHECK (dead_stock_days BETWEEN 30 AND 3650),
        updated_at text NOT NULL
      )`);

    const statuses = `('draft', 'awaiting_approval', 'approved', 'sent', 'partly_received', 'received', 'cancelled', 'closed')`;
    await q(`
      CREATE TABLE purchase_orders (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        number bigint NOT NULL CHECK (number > 0),
        supplier_id varchar(36) NOT NULL,
        status varchar(20) NOT NULL CHECK (status IN ${statuses}),
        currency varchar(3) NOT NULL,
        exchange_rate varchar(24) NOT NULL,
        total_minor bigint NOT NULL CHECK (total_minor >= 0),
        total_shop_minor bigint NOT NULL CHECK (total_shop_minor >= 0),
        note varchar(1000) NULL,
        created_by_user_id varchar(36) NULL,
        approval_requested_at text NULL,
        approved_by_user_id varchar(36) NULL,
        approved_at text NULL,
        rejection_reason varchar(500) NULL,
        sent_at text NULL,
        closed_reason varchar(500) NULL,
        closed_at text NULL,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, number),
        FOREIGN KEY (shop_id, supplier_id) REFERENCES suppliers (shop_id, id)
      )`);
    await q(`CREATE INDEX idx_purchase_orders_status ON purchase_orders (shop_id, status)`);
    await q(`CREATE INDEX idx_purchase_orders_supplier ON purchase_orders (shop_id, supplier_id)`);

    await q(`
      CREATE TABLE purchase_order_lines (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        order_id varchar(36) NOT NULL,
        position bigint NOT NULL,
        part_id varchar(36) NOT NULL,
        supplier_number varchar(40) NULL,
        description varchar(200) NOT NULL,
        quantity bigint NOT NULL CHECK (quantity > 0),
        received_quantity bigint NOT NULL DEFAULT 0 CHECK (received_quantity >= 0),
        cancelled_quantity bigint NOT NULL DEFAULT 0 CHECK (cancelled_quantity >= 0),
        unit_price_minor bigint NOT NULL CHECK (unit_price_minor >= 0),
        core_deposit_minor bigint NOT NULL DEFAULT 0 CHECK (core_deposit_minor >= 0),
        purpose varchar(200) NULL,
        UNIQUE (shop_id, id),
        CHECK (received_quantity + cancelled_quantity <= quantity),
        FOREIGN KEY (shop_id, order_id) REFERENCES purchase_orders (shop_id, id) ON DELETE CASCADE,
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await q(`CREATE INDEX idx_purchase_order_lines_order ON purchase_order_lines (shop_id, order_id)`);
    await q(`CREATE INDEX idx_purchase_order_lines_part ON purchase_order_lines (shop_id, part_id)`);

    await q(`
      CREATE TABLE purchase_receipts (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        order_id varchar(36) NOT NULL,
        line_id varchar(36) NOT NULL,
        bin_id varchar(36) NOT NULL,
        condition varchar(20) NOT NULL,
        quantity bigint NOT NULL CHECK (quantity > 0),
        unit_price_minor bigint NOT NULL CHECK (unit_price_minor >= 0),
        unit_cost_shop_minor bigint NOT NULL CHECK (unit_cost_shop_minor >= 0),
        movement_id varchar(36) NULL,
        user_id varchar(36) NULL,
        received_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, order_id) REFERENCES purchase_orders (shop_id, id),
        FOREIGN KEY (shop_id, line_id) REFERENCES purchase_order_lines (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id)
      )`);
    await q(`CREATE INDEX idx_purchase_receipts_order ON purchase_receipts (shop_id, order_id)`);

    await q(`
      CREATE TABLE supplier_returns (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        kind varchar(10) NOT NULL CHECK (kind IN ('return', 'core')),
        supplier_id varchar(36) NOT NULL,
        order_id varchar(36) NULL,
        line_id varchar(36) NULL,
        part_id varchar(36) NOT NULL,
        bin_id varchar(36) NULL,
        condition varchar(20) NULL,
        quantity bigint NOT NULL CHECK (quantity > 0),
        reason varchar(500) NOT NULL,
        expected_credit_minor bigint NOT NULL CHECK (expected_credit_minor >= 0),
        currency varchar(3) NOT NULL,
        status varchar(10) NOT NULL CHECK (status IN ('open', 'credited')),
        credited_minor bigint NULL,
        credit_reference varchar(120) NULL,
        credited_at text NULL,
        created_by_user_id varchar(36) NULL,
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, supplier_id) REFERENCES suppliers (shop_id, id),
        FOREIGN KEY (shop_id, order_id) REFERENCES purchase_orders (shop_id, id),
        FOREIGN KEY (shop_id, line_id) REFERENCES purchase_order_lines (shop_id, id),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id),
        FOREIGN KEY (shop_id, bin_id) REFERENCES stock_bins (shop_id, id)
      )`);
    await q(`CREATE INDEX idx_supplier_returns_status ON supplier_returns (shop_id, status)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['supplier_returns', 'purchase_receipts', 'purchase_order_lines', 'purchase_orders', 'purchasing_settings', 'part_purchasing', 'supplier_listings', 'suppliers']) {
      await queryRunner.query(`DROP TABLE ${table}`);
    }
  }
}
