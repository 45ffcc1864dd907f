import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Availability at five years of data (issue 12): the bench-time query (live appointments of one shop
 * that end after the range starts) read every past appointment of the shop through
 * IDX_appointments_shop_start, or every shop's live ones through IDX_appointments_status_hold. This
 * index leads with the shop and the state and ranges on `keep_until`, so only the shop's live
 * appointments from the range on are read, and it carries the columns the query returns (no row
 * look-ups).
 */
export class AvailabilityIndexes1766300000000 implements MigrationInterface {
  name = 'AvailabilityIndexes1766300000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      'CREATE INDEX `IDX_appointments_shop_live` ON `appointments` (`shop_id`, `status`, `keep_until`, `start_at`, `bench`, `hold_expires_at`)',
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('DROP INDEX `IDX_appointments_shop_live` ON `appointments`');
  }
}
