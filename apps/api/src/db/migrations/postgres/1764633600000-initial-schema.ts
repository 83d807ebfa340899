import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Users, shops, memberships, sessions, password reset tokens and the audit log.
 *
 * Tenant rule: every shop-owned table has `shop_id` (indexed, FK to shops) and a UNIQUE
 * (shop_id, id) so that children refer to it through a composite key `(shop_id, x_id)`: a row can
 * then only point at rows of its own shop. Sessions use the same trick: `(active_shop_id, user_id)`
 * refers to memberships, so a session can only be active in a shop its user belongs to.
 */
export class InitialSchema1764633600000Pg implements MigrationInterface {
  name = 'InitialSchema1764633600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    // SQLite's NOCASE (`= ? COLLATE NOCASE`): PostgreSQL folds the unquoted name to this collation.
    await queryRunner.query(`CREATE COLLATION nocase (provider = icu, locale = 'und-u-ks-level2', deterministic = false)`);
    await queryRunner.query(`
      CREATE TABLE users (
        id varchar(36) PRIMARY KEY NOT NULL,
        email varchar(254) NOT NULL UNIQUE CHECK (email = lower(email)),
        name varchar(200) NOT NULL,
        password_hash varchar(255) NOT NULL,
        is_platform_admin bigint NOT NULL DEFAULT 0,
        is_active bigint NOT NULL DEFAULT 1,
        created_at text NOT NULL
      )`);
    await queryRunner.query(`
      CREATE TABLE shops (
        id varchar(36) PRIMARY KEY NOT NULL,
        name varchar(200) NOT NULL,
        slug varchar(100) NOT NULL UNIQUE,
        billing_state varchar(20) NOT NULL DEFAULT 'trial'
          CHECK (billing_state IN ('trial', 'active', 'past_due', 'suspended', 'cancelled')),
        created_at text NOT NULL
      )`);
    await queryRunner.query(`
      CREATE TABLE memberships (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        user_id varchar(36) NOT NULL REFERENCES users (id),
        role varchar(20) NOT NULL CHECK (role IN ('owner', 'mechanic', 'buyer', 'viewer')),
        spending_limit_minor bigint NULL CHECK (spending_limit_minor IS NULL OR spending_limit_minor >= 0),
        is_active bigint NOT NULL DEFAULT 1,
        created_at text NOT NULL,
        UNIQUE (shop_id, user_id),
        UNIQUE (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_memberships_shop_id ON memberships (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_memberships_user_id ON memberships (user_id)`);
    await queryRunner.query(`
      CREATE TABLE sessions (
        id varchar(64) PRIMARY KEY NOT NULL,
        user_id varchar(36) NOT NULL REFERENCES users (id) ON DELETE CASCADE,
        active_shop_id varchar(36) NULL,
        created_at text NOT NULL,
        last_seen_at text NOT NULL,
        expires_at text NOT NULL,
        ip varchar(64) NULL,
        user_agent varchar(512) NULL,
        FOREIGN KEY (active_shop_id, user_id) REFERENCES memberships (shop_id, user_id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_sessions_user_id ON sessions (user_id)`);
    await queryRunner.query(`CREATE INDEX idx_sessions_expires_at ON sessions (expires_at)`);
    await queryRunner.query(`CREATE INDEX idx_sessions_last_seen_at ON sessions (last_seen_at)`);
    await queryRunner.query(`
      CREATE TABLE password_reset_tokens (
        id varchar(64) PRIMARY KEY NOT NULL,
        user_id varchar(36) NOT NULL REFERENCES users (id) ON DELETE CASCADE,
        created_at text NOT NULL,
        expires_at text NOT NULL,
        used_at text NULL
      )`);
    await queryRunner.query(`CREATE INDEX idx_password_reset_tokens_user_id ON password_reset_tokens (user_id)`);
    await queryRunner.query(`
      CREATE TABLE audit_events (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NULL REFERENCES shops (id),
        actor_user_id varchar(36) NULL REFERENCES users (id),
        actor_api_key_id varchar(36) NULL,
        action varchar(100) NOT NULL,
        entity varchar(100) NOT NULL,
        entity_id varchar(100) NULL,
        changes text NOT NULL,
        ip varchar(64) NULL,
        created_at text NOT NULL
      )`);
    await queryRunner.query(`CREATE INDEX idx_audit_events_shop_id_created_at ON audit_events (shop_id, created_at)`);
    await queryRunner.query(`CREATE INDEX idx_audit_events_actor_user_id ON audit_events (actor_user_id)`);
    // The audit log is append-only, enforced by the database itself (one function serves every append-only table).
    await queryRunner.query(`
      CREATE FUNCTION tappet_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN RAISE EXCEPTION '%', TG_ARGV[0] USING ERRCODE = 'restrict_violation'; END $$`);
    await queryRunner.query(`CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events FOR EACH ROW EXECUTE FUNCTION tappet_refuse_change('audit_events is append-only')`);
    await queryRunner.query(`CREATE TRIGGER audit_events_no_delete BEFORE DELETE ON audit_events FOR EACH ROW EXECUTE FUNCTION tappet_refuse_change('audit_events is append-only')`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    // Reverting is for development only (platform-notes.md trap 2): restore a backup in production.
    await queryRunner.query(`DROP TABLE audit_events`);
    await queryRunner.query(`DROP TABLE password_reset_tokens`);
    await queryRunner.query(`DROP TABLE sessions`);
    await queryRunner.query(`DROP TABLE memberships`);
    await queryRunner.query(`DROP TABLE shops`);
    await queryRunner.query(`DROP TABLE users`);
    await queryRunner.query(`DROP FUNCTION tappet_refuse_change`);
    await queryRunner.query(`DROP COLLATION nocase`);
  }
}
