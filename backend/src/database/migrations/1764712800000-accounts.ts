import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Accounts (issue 4): shops, users (riders and shop staff through `shop_id`), password-reset
 * tokens, staff invitations, the rider's bikes and saved baseline sheets.
 *
 * Written from `migration:generate` against an empty MariaDB 10.11 and checked by hand: readable
 * index and key names, DATETIME(3) in UTC (the connection runs with timezone 'Z'), UUID ids in
 * MariaDB's native `uuid` type, tokens stored only as hex SHA-256, `json` columns (MariaDB adds a
 * json_valid CHECK itself). A second `migration:generate` after this one finds nothing to change.
 */
export class Accounts1764712800000 implements MigrationInterface {
  name = 'Accounts1764712800000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE \`shops\` (
        \`id\` uuid NOT NULL,
        \`slug\` varchar(80) NOT NULL,
        \`name\` varchar(120) NOT NULL,
        \`town\` varchar(120) NOT NULL,
        \`time_zone\` varchar(64) NOT NULL,
        \`currency\` char(3) NOT NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        UNIQUE INDEX \`UQ_shops_slug\` (\`slug\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`users\` (
        \`id\` uuid NOT NULL,
        \`email\` varchar(254) NOT NULL,
        \`name\` varchar(100) NOT NULL,
        \`role\` enum ('rider', 'technician', 'owner') NOT NULL DEFAULT 'rider',
        \`password_hash\` varchar(255) NOT NULL,
        \`token_version\` int UNSIGNED NOT NULL DEFAULT '0',
        \`shop_id\` uuid NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        UNIQUE INDEX \`UQ_users_email\` (\`email\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`password_reset_tokens\` (
        \`id\` uuid NOT NULL,
        \`user_id\` uuid NOT NULL,
        \`token_hash\` char(64) NOT NULL,
        \`expires_at\` datetime(3) NOT NULL,
        \`used_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_password_reset_tokens_user\` (\`user_id\`),
        UNIQUE INDEX \`UQ_password_reset_tokens_token_hash\` (\`token_hash\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`invitations\` (
        \`id\` uuid NOT NULL,
        \`shop_id\` uuid NOT NULL,
        \`email\` varchar(254) NOT NULL,
        \`role\` enum ('technician', 'owner') NOT NULL,
        \`token_hash\` char(64) NOT NULL,
        \`invited_by_id\` uuid NULL,
        \`expires_at\` datetime(3) NOT NULL,
        \`accepted_at\` datetime(3) NULL,
        \`revoked_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_invitations_shop\` (\`shop_id\`),
        UNIQUE INDEX \`UQ_invitations_token_hash\` (\`token_hash\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`bikes\` (
        \`id\` uuid NOT NULL,
        \`owner_id\` uuid NOT NULL,
        \`name\` varchar(100) NOT NULL,
        \`fork\` json NULL,
        \`shock\` json NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        INDEX \`IDX_bikes_owner_created\` (\`owner_id\`, \`created_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`baseline_sheets\` (
        \`id\` uuid NOT NULL,
        \`owner_id\` uuid NOT NULL,
        \`name\` varchar(120) NOT NULL,
        \`input\` json NOT NULL,
        \`result\` json NOT NULL,
        \`summary\` json NOT NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        INDEX \`IDX_baseline_sheets_owner_created\` (\`owner_id\`, \`created_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    // A shop with staff cannot be deleted by accident; a user's own records go with the user.
    await q.query(
      `ALTER TABLE \`users\` ADD CONSTRAINT \`FK_users_shop\` FOREIGN KEY (\`shop_id\`)
        REFERENCES \`shops\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE \`password_reset_tokens\` ADD CONSTRAINT \`FK_password_reset_tokens_user\` FOREIGN KEY (\`user_id\`)
        REFERENCES \`users\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE \`invitations\` ADD CONSTRAINT \`FK_invitations_shop\` FOREIGN KEY (\`shop_id\`)
        REFERENCES \`shops\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE \`invitations\` ADD CONSTRAINT \`FK_invitations_invited_by\` FOREIGN KEY (\`invited_by_id\`)
        REFERENCES \`users\`(\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE \`bikes\` ADD CONSTRAINT \`FK_bikes_owner\` FOREIGN KEY (\`owner_id\`)
        REFERENCES \`users\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE \`baseline_sheets\` ADD CONSTRAINT \`FK_baseline_sheets_owner\` FOREIGN KEY (\`owner_id\`)
        REFERENCES \`users\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    // Tables that point at others go first; dropping a table drops its keys and indexes with it.
    await q.query('DROP TABLE `baseline_sheets`');
    await q.query('DROP TABLE `bikes`');
    await q.query('DROP TABLE `invitations`');
    await q.query('DROP TABLE `password_reset_tokens`');
    await q.query('DROP TABLE `users`');
    await q.query('DROP TABLE `shops`');
  }
}
