import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Billing and the platform console: plans (Tappet's own names, mapped to Stripe prices by lookup
 * key), one billing record per shop, the Stripe events already processed (idempotency) and the
 * owners' time-boxed support-access grants. Nothing here is ever deleted for non-payment.
 */
export class Billing1765200000000Pg implements MigrationInterface {
  name = 'Billing1765200000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE plans (
        id varchar(36) PRIMARY KEY NOT NULL,
        name varchar(60) NOT NULL UNIQUE,
        monthly_price_minor bigint NOT NULL CHECK (monthly_price_minor >= 0),
        currency varchar(3) NOT NULL CHECK (currency = lower(currency)),
        stripe_lookup_key varchar(200) NOT NULL UNIQUE,
        seat_limit bigint NULL CHECK (seat_limit IS NULL OR seat_limit >= 1),
        catalogue_limit bigint NULL CHECK (catalogue_limit IS NULL OR catalogue_limit >= 0),
        vehicle_limit bigint NULL CHECK (vehicle_limit IS NULL OR vehicle_limit >= 0),
        is_active bigint NOT NULL DEFAULT 1,
        created_at text NOT NULL,
        updated_at text NOT NULL
      )`);
    await queryRunner.query(`
      CREATE TABLE shop_billing (
        shop_id varchar(36) PRIMARY KEY NOT NULL REFERENCES shops (id),
        plan_id varchar(36) NULL REFERENCES plans (id),
        trial_ends_at text NOT NULL,
        stripe_customer_id varchar(100) NULL UNIQUE,
        stripe_subscription_id varchar(100) NULL UNIQUE,
        stripe_status varchar(30) NULL,
        current_period_end text NULL,
        cancel_at_period_end bigint NOT NULL DEFAULT 0,
        past_due_since text NULL,
        manual_suspension_reason varchar(500) NULL,
        manual_suspended_at text NULL,
        updated_at text NOT NULL
      )`);
    await queryRunner.query(`CREATE INDEX idx_shop_billing_plan_id ON shop_billing (plan_id)`);
    await queryRunner.query(`
      CREATE TABLE billing_events (
        id varchar(100) PRIMARY KEY NOT NULL,
        type varchar(100) NOT NULL,
        shop_id varchar(36) NULL REFERENCES shops (id),
        received_at text NOT NULL
      )`);
    await queryRunner.query(`CREATE INDEX idx_billing_events_shop_id ON billing_events (shop_id)`);
    await queryRunner.query(`
      CREATE TABLE support_grants (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        granted_by_user_id varchar(36) NOT NULL REFERENCES users (id),
        note varchar(500) NULL,
        created_at text NOT NULL,
        expires_at text NOT NULL,
        revoked_at text NULL,
        revoked_by_user_id varchar(36) NULL REFERENCES users (id),
        UNIQUE (shop_id, id),
        CHECK (expires_at > created_at)
      )`);
    await queryRunner.query(`CREATE INDEX idx_support_grants_shop_id ON support_grants (shop_id, expires_at)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE support_grants`);
    await queryRunner.query(`DROP TABLE billing_events`);
    await queryRunner.query(`DROP TABLE shop_billing`);
    await queryRunner.query(`DROP TABLE plans`);
  }
}
