import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * State shared between API processes (issue 15): rate-limit counters move from process memory
 * into the database, one row per bucket and key with its fixed window (times in ms since the
 * epoch) and the hits counted in it. Closed windows are deleted by the store now and then.
 * Each shop gets a catalogue version, moved by every catalogue write, so that every process knows
 * when its cached lineage graph of the shop is stale.
 */
export class SharedState1766100000000 implements MigrationInterface {
  name = 'SharedState1766100000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE rate_limit_counters (
      bucket varchar(64) NOT NULL,
      key text NOT NULL,
      window_start integer NOT NULL,
      window_end integer NOT NULL,
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
