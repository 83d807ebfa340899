import type { MigrationInterface, QueryRunner } from 'typeorm';

/** PostgreSQL twin of ../1766200000000-stock-movements-by-kind.ts: the ledger indexed by kind, part and time. */
export class StockMovementsByKind1766200000000Pg implements MigrationInterface {
  name = 'StockMovementsByKind1766200000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE INDEX idx_stock_movements_kind_part ON stock_movements (shop_id, kind, part_id, occurred_at)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX idx_stock_movements_kind_part`);
  }
}
