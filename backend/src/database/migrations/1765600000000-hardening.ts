import { domainToASCII } from 'node:url';
import type { MigrationInterface, QueryRunner } from 'typeorm';

/** common/email.ts as it was when this migration was written (a migration never changes later). */
function normaliseEmail(input: string): string {
  const s = input.normalize('NFC').trim().toLowerCase();
  const at = s.lastIndexOf('@');
  if (at <= 0 || at === s.length - 1) return s;
  const domain = domainToASCII(s.slice(at + 1));
  return domain ? `${s.slice(0, at)}@${domain}` : s;
}

/**
 * Hardening (issue 8):
 * - `users.email` and `invitations.email` compare byte for byte (utf8mb4_bin), and the addresses
 *   already stored are rewritten to the one normalised form (NFC, trimmed, lower-cased, IDNA
 *   domain). Two accounts whose addresses become equal stop the migration with their ids, for a
 *   person to decide (nothing is changed then).
 * - `user_sessions`: one row per sign-in; sign-out revokes it (the JWT carries its id).
 * - `mail_outbox`: every mail the app sends, written with the change it reports.
 */
export class Hardening1765600000000 implements MigrationInterface {
  name = 'Hardening1765600000000';

  public async up(q: QueryRunner): Promise<void> {
    const users = (await q.query('SELECT `id`, `email` FROM `users`')) as { id: string; email: string }[];
    const seen = new Map<string, string>();
    const clashes: string[] = [];
    for (const u of users) {
      const n = normaliseEmail(u.email);
      const other = seen.get(n);
      if (other) clashes.push(`${other} and ${u.id}`);
      seen.set(n, u.id);
    }
    if (clashes.length > 0) {
      throw new Error(
        `These accounts have the same address once normalised; merge or rename one of each pair first: ${clashes.join('; ')}`,
      );
    }
    await q.query(
      'ALTER TABLE `users` MODIFY `email` varchar(254) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL',
    );
    await q.query(
      'ALTER TABLE `invitations` MODIFY `email` varchar(254) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL',
    );
    await q.query('CREATE INDEX `IDX_invitations_email` ON `invitations` (`email`)');
    for (const u of users) {
      const n = normaliseEmail(u.email);
      if (n !== u.email) await q.query('UPDATE `users` SET `email` = ? WHERE `id` = ?', [n, u.id]);
    }
    const invitations = (await q.query('SELECT `id`, `email` FROM `invitations`')) as {
      id: string;
      email: string;
    }[];
    for (const i of invitations) {
      const n = normaliseEmail(i.email);
      if (n !== i.email) await q.query('UPDATE `invitations` SET `email` = ? WHERE `id` = ?', [n, i.id]);
    }

    await q.query(
      `CREATE TABLE \`user_sessions\` (
        \`id\` uuid NOT NULL,
        \`user_id\` uuid NOT NULL,
        \`expires_at\` datetime(3) NOT NULL,
        \`revoked_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_user_sessions_user\` (\`user_id\`, \`expires_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `ALTER TABLE \`user_sessions\` ADD CONSTRAINT \`FK_user_sessions_user\` FOREIGN KEY (\`user_id\`)
        REFERENCES \`users\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `CREATE TABLE \`mail_outbox\` (
        \`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT,
        \`kind\` varchar(40) NOT NULL,
        \`ref_id\` uuid NULL,
        \`payload\` blob NULL,
        \`attempts\` int UNSIGNED NOT NULL DEFAULT '0',
        \`next_attempt_at\` datetime(3) NOT NULL,
        \`claimed_by\` char(36) NULL,
        \`claimed_until\` datetime(3) NULL,
        \`sent_at\` datetime(3) NULL,
        \`failed_at\` datetime(3) NULL,
        \`last_error\` varchar(500) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_mail_outbox_due\` (\`sent_at\`, \`failed_at\`, \`next_attempt_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `mail_outbox`');
    await q.query('DROP TABLE `user_sessions`');
    await q.query('DROP INDEX `IDX_invitations_email` ON `invitations`');
    // The addresses stay normalised; only the comparison goes back to accent-insensitive.
    await q.query(
      'ALTER TABLE `invitations` MODIFY `email` varchar(254) CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci NOT NULL',
    );
    await q.query(
      'ALTER TABLE `users` MODIFY `email` varchar(254) CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci NOT NULL',
    );
  }
}
