import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Payments (issue 10): one payment per held appointment (its intent at the payment service),
 * the refunds made from it with who and why, and the webhook events acted on (once each).
 */
export class Payments1766000000000 implements MigrationInterface {
  name = 'Payments1766000000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE \`payments\` (
        \`id\` uuid NOT NULL,
        \`appointment_id\` uuid NOT NULL,
        \`shop_id\` uuid NOT NULL,
        \`intent_id\` varchar(255) NOT NULL,
        \`kind\` enum ('deposit', 'full') NOT NULL,
        \`amount_minor\` int UNSIGNED NOT NULL,
        \`currency\` char(3) NOT NULL,
        \`status\` enum ('requires_payment_method', 'requires_confirmation', 'requires_action', 'processing', 'succeeded', 'canceled') NOT NULL DEFAULT 'requires_payment_method',
        \`paid_minor\` int UNSIGNED NOT NULL DEFAULT '0',
        \`paid_at\` datetime(3) NULL,
        \`card_brand\` varchar(20) NULL,
        \`card_last4\` char(4) NULL,
        \`last_error\` varchar(500) NULL,
        \`cancel_wanted\` tinyint NOT NULL DEFAULT 0,
        \`cancel_attempts\` smallint UNSIGNED NOT NULL DEFAULT '0',
        \`next_attempt_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        \`version\` int NOT NULL,
        UNIQUE INDEX \`UQ_payments_appointment\` (\`appointment_id\`),
        UNIQUE INDEX \`UQ_payments_intent\` (\`intent_id\`),
        INDEX \`IDX_payments_shop_created\` (\`shop_id\`, \`created_at\`),
        INDEX \`IDX_payments_cancel\` (\`cancel_wanted\`, \`next_attempt_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`payment_refunds\` (
        \`id\` uuid NOT NULL,
        \`payment_id\` uuid NOT NULL,
        \`request_key\` varchar(120) NOT NULL,
        \`amount_minor\` int UNSIGNED NOT NULL,
        \`kind\` enum ('decline', 'rider-cancel', 'shop-cancel', 'late-payment', 'manual') NOT NULL,
        \`reason\` varchar(500) NOT NULL,
        \`actor_id\` uuid NULL,
        \`actor_side\` enum ('rider', 'staff', 'system') NOT NULL,
        \`status\` enum ('pending', 'succeeded', 'failed') NOT NULL DEFAULT 'pending',
        \`refund_ref\` varchar(255) NULL,
        \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0',
        \`next_attempt_at\` datetime(3) NOT NULL,
        \`last_error\` varchar(500) NULL,
        \`done_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        INDEX \`IDX_payment_refunds_payment\` (\`payment_id\`),
        UNIQUE INDEX \`UQ_payment_refunds_request\` (\`request_key\`),
        INDEX \`IDX_payment_refunds_due\` (\`status\`, \`next_attempt_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`payment_events\` (
        \`id\` varchar(255) NOT NULL,
        \`type\` varchar(100) NOT NULL,
        \`intent_id\` varchar(255) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_payment_events_intent\` (\`intent_id\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      'ALTER TABLE `payments` ADD CONSTRAINT `FK_payments_appointment` FOREIGN KEY (`appointment_id`) REFERENCES `appointments`(`id`) ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await q.query(
      'ALTER TABLE `payment_refunds` ADD CONSTRAINT `FK_payment_refunds_payment` FOREIGN KEY (`payment_id`) REFERENCES `payments`(`id`) ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await q.query(
      'ALTER TABLE `payment_refunds` ADD CONSTRAINT `FK_payment_refunds_actor` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE SET NULL ON UPDATE NO ACTION',
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE `payment_refunds` DROP FOREIGN KEY `FK_payment_refunds_actor`');
    await q.query('ALTER TABLE `payment_refunds` DROP FOREIGN KEY `FK_payment_refunds_payment`');
    await q.query('ALTER TABLE `payments` DROP FOREIGN KEY `FK_payments_appointment`');
    await q.query('DROP TABLE `payment_events`');
    await q.query('DROP TABLE `payment_refunds`');
    await q.query('DROP TABLE `payments`');
  }
}
