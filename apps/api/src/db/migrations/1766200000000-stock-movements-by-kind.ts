import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The reorder list's "last issued" per part (issue 14): one index over the ledger by kind, then
 * part and time, so the latest issue of every part is read from the index alone instead of from
 * every movement of the shop.
 */
export class StockMovementsByKind1766200000000 implements MigrationInterface {
  name = 'StockMovementsByKind1766200000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE INDEX idx_stock_movements_kind_part ON stock_movements (shop_id, kind, part_id, occurred_at)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX idx_stock_movements_kind_part`);
  }
}
