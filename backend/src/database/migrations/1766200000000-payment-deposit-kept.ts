import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A move inside the cancellation window keeps the deposit (payments.deposit_kept). */
export class PaymentDepositKept1766200000000 implements MigrationInterface {
  name = 'PaymentDepositKept1766200000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE `payments` ADD `deposit_kept` tinyint NOT NULL DEFAULT 0');
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE `payments` DROP COLUMN `deposit_kept`');
  }
}
