import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Vehicles (issue 9): customers, vehicles, their status changes, odometer readings and uploaded
 * files. Every table is shop-owned (shop_id, index, FK, UNIQUE (shop_id, id)); children point at
 * their parent through (shop_id, parent_id) so the database refuses a link across shops.
 */
export class Vehicles1765100000000Pg implements MigrationInterface {
  name = 'Vehicles1765100000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE customers (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        name varchar(120) NOT NULL CHECK (length(name) > 0),
        email varchar(254) NULL CHECK (email IS NULL OR email = lower(email)),
        phone varchar(40) NULL,
        address varchar(500) NULL,
        notes varchar(2000) NULL,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_customers_shop_id ON customers (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_customers_shop_id_name ON customers (shop_id, name)`);
    await queryRunner.query(`
      CREATE TABLE vehicles (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        kind varchar(20) NOT NULL CHECK (kind IN ('customer', 'shop_stock', 'consignment')),
        marque varchar(60) NOT NULL,
        model varchar(80) NOT NULL,
        year bigint NULL CHECK (year IS NULL OR year BETWEEN 1885 AND 2100),
        colour varchar(60) NULL,
        frame_number varchar(40) NULL,
        engine_number varchar(40) NULL,
        vin varchar(17) NULL CHECK (vin IS NULL OR (vin = upper(vin) AND vin !~ '[IOQ]')),
        vin_check_acknowledged_by_user_id varchar(36) NULL REFERENCES users (id),
        vin_check_acknowledged_at text NULL,
        condition varchar(30) NULL CHECK (condition IS NULL OR condition IN ('incomplete', 'complete_project', 'runs_needs_work', 'sorted_rider', 'freshly_restored')),
        notes varchar(4000) NULL,
        customer_id varchar(36) NULL,
        acquisition_cost_minor bigint NULL CHECK (acquisition_cost_minor IS NULL OR acquisition_cost_minor >= 0),
        asking_price_minor bigint NULL CHECK (asking_price_minor IS NULL OR asking_price_minor >= 0),
        status varchar(20) NOT NULL CHECK (status IN ('arrived', 'assessing', 'in_work', 'ready', 'handed_over', 'sold')),
        status_since text NOT NULL,
        numbers_matching bigint NULL,
        numbers_checked_by_user_id varchar(36) NULL REFERENCES users (id),
        numbers_checked_at text NULL,
        numbers_note varchar(500) NULL,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, customer_id) REFERENCES customers (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_vehicles_shop_id ON vehicles (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_vehicles_shop_id_status ON vehicles (shop_id, status)`);
    await queryRunner.query(`CREATE INDEX idx_vehicles_shop_id_marque ON vehicles (shop_id, marque)`);
    await queryRunner.query(`CREATE INDEX idx_vehicles_shop_id_customer_id ON vehicles (shop_id, customer_id)`);
    await queryRunner.query(`
      CREATE TABLE vehicle_status_changes (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        vehicle_id varchar(36) NOT NULL,
        from_status varchar(20) NULL,
        to_status varchar(20) NOT NULL,
        changed_at text NOT NULL,
        recorded_at text NOT NULL,
        by_user_id varchar(36) NULL REFERENCES users (id),
        note varchar(500) NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_vehicle_status_changes_shop_id ON vehicle_status_changes (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_vehicle_status_changes_vehicle ON vehicle_status_changes (shop_id, vehicle_id)`);
    await queryRunner.query(`
      CREATE TABLE odometer_readings (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        vehicle_id varchar(36) NOT NULL,
        value bigint NOT NULL CHECK (value >= 0),
        unit varchar(2) NOT NULL CHECK (unit IN ('mi', 'km')),
        read_on varchar(10) NOT NULL,
        note varchar(200) NULL,
        by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_odometer_readings_shop_id ON odometer_readings (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_odometer_readings_vehicle ON odometer_readings (shop_id, vehicle_id)`);
    await queryRunner.query(`
      CREATE TABLE vehicle_files (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        vehicle_id varchar(36) NOT NULL,
        kind varchar(10) NOT NULL CHECK (kind IN ('photo', 'document')),
        original_name varchar(200) NOT NULL,
        media_type varchar(60) NOT NULL,
        byte_size bigint NOT NULL CHECK (byte_size > 0),
        storage_key varchar(200) NOT NULL,
        thumbnail_key varchar(200) NULL,
        width bigint NULL,
        height bigint NULL,
        caption varchar(200) NULL,
        by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (storage_key),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_vehicle_files_shop_id ON vehicle_files (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_vehicle_files_vehicle ON vehicle_files (shop_id, vehicle_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    // Development only (platform-notes.md trap 2).
    await queryRunner.query(`DROP TABLE vehicle_files`);
    await queryRunner.query(`DROP TABLE odometer_readings`);
    await queryRunner.query(`DROP TABLE vehicle_status_changes`);
    await queryRunner.query(`DROP TABLE vehicles`);
    await queryRunner.query(`DROP TABLE customers`);
  }
}
