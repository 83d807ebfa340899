import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Purchasing (issue 8): an order line can be bought for a job's special order. The line keeps the
 * special order's id, so the reorder list stops offering it once a live order covers it, and the
 * receipt holds what arrives for that job. Same-shop reference through (shop_id, id).
 */
export class PurchaseSpecialOrders1766000000000Pg implements MigrationInterface {
  name = 'PurchaseSpecialOrders1766000000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE purchase_order_lines ADD COLUMN special_order_id varchar(36) NULL REFERENCES job_special_orders (id)`);
    await queryRunner.query(`CREATE INDEX idx_purchase_order_lines_special_order ON purchase_order_lines (shop_id, special_order_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX idx_purchase_order_lines_special_order`);
    await queryRunner.query(`ALTER TABLE purchase_order_lines DROP COLUMN special_order_id`);
  }
}
