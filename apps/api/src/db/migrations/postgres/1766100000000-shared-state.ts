import type { MigrationInterface, QueryRunner } from 'typeorm';

/** PostgreSQL twin of ../1766100000000-shared-state.ts: rate-limit counters, shops' catalogue versions. */
export class SharedState1766100000000Pg implements MigrationInterface {
  name = 'SharedState1766100000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE rate_limit_counters (
      bucket varchar(64) NOT NULL,
      key text NOT NULL,
      window_start bigint NOT NULL,
      window_end bigint NOT NULL,
      hits integer NOT NULL,
      PRIMARY KEY (bucket, key)
    )`);
    await queryRunner.query(`CREATE INDEX idx_rate_limit_counters_window_end ON rate_limit_counters (window_end)`);
    await queryRunner.query(`ALTER TABLE shops ADD COLUMN catalogue_version integer NOT NULL DEFAULT 0`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE shops DROP COLUMN catalogue_version`);
    await queryRunner.query(`DROP TABLE rate_limit_counters`);
  }
}
