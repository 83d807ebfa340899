import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Shop administration: staff invitations, API keys and shop settings.
 *
 * Secrets are stored only as SHA-256 (hex) of the random token or key; the export leaves out
 * every `*_hash` column. All three tables are shop-owned (shop_id, index, FK, UNIQUE (shop_id, id)).
 */
export class ShopAdministration1764806400000Pg implements MigrationInterface {
  name = 'ShopAdministration1764806400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE invitations (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        email varchar(254) NOT NULL CHECK (email = lower(email)),
        role varchar(20) NOT NULL CHECK (role IN ('owner', 'mechanic', 'buyer', 'viewer')),
        spending_limit_minor bigint NULL CHECK (spending_limit_minor IS NULL OR spending_limit_minor >= 0),
        token_hash varchar(64) NOT NULL UNIQUE,
        invited_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        sent_at text NOT NULL,
        expires_at text NOT NULL,
        accepted_at text NULL,
        accepted_user_id varchar(36) NULL REFERENCES users (id),
        withdrawn_at text NULL,
        UNIQUE (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_invitations_shop_id ON invitations (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_invitations_shop_id_email ON invitations (shop_id, email)`);
    await queryRunner.query(`
      CREATE TABLE api_keys (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        label varchar(100) NOT NULL,
        role varchar(20) NOT NULL CHECK (role IN ('viewer', 'buyer')),
        secret_hash varchar(64) NOT NULL UNIQUE,
        created_by_user_id varchar(36) NOT NULL REFERENCES users (id),
        bound_user_id varchar(36) NULL,
        integration_name varchar(100) NULL,
        created_at text NOT NULL,
        last_used_at text NULL,
        revoked_at text NULL,
        UNIQUE (shop_id, id),
        -- A key acts either for a member of its own shop or for a named integration.
        FOREIGN KEY (shop_id, bound_user_id) REFERENCES memberships (shop_id, user_id),
        CHECK ((bound_user_id IS NULL) <> (integration_name IS NULL))
      )`);
    await queryRunner.query(`CREATE INDEX idx_api_keys_shop_id ON api_keys (shop_id)`);
    await queryRunner.query(`
      CREATE TABLE shop_settings (
        shop_id varchar(36) PRIMARY KEY NOT NULL REFERENCES shops (id),
        address varchar(500) NOT NULL DEFAULT '',
        currency varchar(3) NOT NULL DEFAULT 'GBP' CHECK (length(currency) = 3 AND currency = upper(currency)),
        distance_unit varchar(2) NOT NULL DEFAULT 'mi' CHECK (distance_unit IN ('mi', 'km')),
        pressure_unit varchar(3) NOT NULL DEFAULT 'psi' CHECK (pressure_unit IN ('psi', 'kPa', 'bar')),
        tax_rate_milli_percent bigint NOT NULL DEFAULT 20000 CHECK (tax_rate_milli_percent BETWEEN 0 AND 100000),
        labour_rate_minor_per_hour bigint NOT NULL DEFAULT 6000 CHECK (labour_rate_minor_per_hour >= 0),
        service_level_milli bigint NOT NULL DEFAULT 950 CHECK (service_level_milli BETWEEN 500 AND 999),
        ordering_cost_minor bigint NOT NULL DEFAULT 2500 CHECK (ordering_cost_minor >= 0),
        holding_cost_rate_milli_percent bigint NOT NULL DEFAULT 25000 CHECK (holding_cost_rate_milli_percent BETWEEN 0 AND 100000),
        label_sheet_format varchar(20) NOT NULL DEFAULT 'a4-3x8' CHECK (label_sheet_format IN ('a4-3x8', 'letter-3x10', 'roll-62x29')),
        updated_at text NOT NULL
      )`);
    await queryRunner.query(`CREATE INDEX idx_audit_events_actor_api_key_id ON audit_events (actor_api_key_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    // Development only (platform-notes.md trap 2).
    await queryRunner.query(`DROP INDEX idx_audit_events_actor_api_key_id`);
    await queryRunner.query(`DROP TABLE shop_settings`);
    await queryRunner.query(`DROP TABLE api_keys`);
    await queryRunner.query(`DROP TABLE invitations`);
  }
}
