import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The auth routes' protections shared by every app instance (docs/scaling.md), before kept in each
 * process's memory:
 * - `rate_limit_hits`: @nestjs/throttler's counters, one row per throttler and key (the SHA-256 of
 *   both, never a client address): hits in the current window, when it ends, until when the key is
 *   blocked, and when the row may go (`expires_at`, the later of the two; the sweep's index).
 * - `sign_in_failures`: failed sign-ins per address, by the SHA-256 of the normalised address, with
 *   the last failure's time (the sweep's index: rows quiet for 15 minutes are deleted).
 */
export class SharedRateLimits1766400000000 implements MigrationInterface {
  name = 'SharedRateLimits1766400000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE \`rate_limit_hits\` (
        \`key_hash\` char(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        \`hits\` int UNSIGNED NOT NULL,
        \`window_ends_at\` datetime(3) NOT NULL,
        \`blocked_until\` datetime(3) NULL,
        \`expires_at\` datetime(3) NOT NULL,
        INDEX \`IDX_rate_limit_hits_expires\` (\`expires_at\`),
        PRIMARY KEY (\`key_hash\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`sign_in_failures\` (
        \`email_hash\` char(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        \`failures\` int UNSIGNED NOT NULL,
        \`last_failure_at\` datetime(3) NOT NULL,
        INDEX \`IDX_sign_in_failures_last\` (\`last_failure_at\`),
        PRIMARY KEY (\`email_hash\`)
      ) ENGINE=InnoDB`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `sign_in_failures`');
    await q.query('DROP TABLE `rate_limit_hits`');
  }
}
