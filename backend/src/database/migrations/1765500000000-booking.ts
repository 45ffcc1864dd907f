import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Booking (issue 9): a shop's booking settings, opening intervals and closures, its services, and
 * appointments with the 5-minute cells they keep per bench (the primary key of `appointment_cells`
 * is what makes a double booking impossible) and their history.
 *
 * Written in the shape `migration:generate` gives and checked against it: after this migration a
 * second `migration:generate` finds nothing to change.
 */
export class Booking1765500000000 implements MigrationInterface {
  name = 'Booking1765500000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      `ALTER TABLE \`shops\`
        ADD \`benches\` tinyint UNSIGNED NOT NULL DEFAULT '1',
        ADD \`slot_step_minutes\` smallint UNSIGNED NOT NULL DEFAULT '30',
        ADD \`min_notice_minutes\` int UNSIGNED NOT NULL DEFAULT '720',
        ADD \`max_days_ahead\` smallint UNSIGNED NOT NULL DEFAULT '60',
        ADD \`hold_minutes\` smallint UNSIGNED NOT NULL DEFAULT '15',
        ADD \`cancellation_window_hours\` smallint UNSIGNED NOT NULL DEFAULT '48',
        ADD \`calendar_token_hash\` char(64) NULL`,
    );
    await q.query(
      `CREATE TABLE \`shop_opening_intervals\` (
        \`id\` uuid NOT NULL,
        \`shop_id\` uuid NOT NULL,
        \`weekday\` tinyint UNSIGNED NOT NULL,
        \`start_minute\` smallint UNSIGNED NOT NULL,
        \`end_minute\` smallint UNSIGNED NOT NULL,
        INDEX \`IDX_shop_opening_intervals_shop\` (\`shop_id\`, \`weekday\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`shop_closures\` (
        \`id\` uuid NOT NULL,
        \`shop_id\` uuid NOT NULL,
        \`from_date\` date NOT NULL,
        \`to_date\` date NOT NULL,
        \`reason\` varchar(200) NOT NULL,
        INDEX \`IDX_shop_closures_shop\` (\`shop_id\`, \`from_date\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`shop_services\` (
        \`id\` uuid NOT NULL,
        \`shop_id\` uuid NOT NULL,
        \`name\` varchar(120) NOT NULL,
        \`description\` varchar(1000) NOT NULL DEFAULT '',
        \`duration_minutes\` smallint UNSIGNED NOT NULL,
        \`buffer_after_minutes\` smallint UNSIGNED NOT NULL DEFAULT '0',
        \`price_minor\` int UNSIGNED NOT NULL,
        \`deposit_minor\` int UNSIGNED NOT NULL,
        \`active\` tinyint NOT NULL DEFAULT 1,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        INDEX \`IDX_shop_services_shop\` (\`shop_id\`, \`active\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`appointments\` (
        \`id\` uuid NOT NULL,
        \`shop_id\` uuid NOT NULL,
        \`service_id\` uuid NOT NULL,
        \`rider_id\` uuid NOT NULL,
        \`bike_id\` uuid NULL,
        \`bike_snapshot\` json NULL,
        \`baseline_sheet_id\` uuid NULL,
        \`notes\` varchar(2000) NOT NULL DEFAULT '',
        \`status\` enum ('held', 'requested', 'confirmed', 'declined', 'cancelled', 'expired', 'completed', 'no_show') NOT NULL,
        \`start_at\` datetime(3) NOT NULL,
        \`end_at\` datetime(3) NOT NULL,
        \`keep_until\` datetime(3) NOT NULL,
        \`bench\` tinyint UNSIGNED NOT NULL,
        \`hold_expires_at\` datetime(3) NULL,
        \`price_minor\` int UNSIGNED NOT NULL,
        \`deposit_minor\` int UNSIGNED NOT NULL,
        \`currency\` char(3) NOT NULL,
        \`proposed_start_at\` datetime(3) NULL,
        \`decline_reason\` varchar(500) NULL,
        \`cancel_reason\` varchar(500) NULL,
        \`sequence\` int UNSIGNED NOT NULL DEFAULT '0',
        \`reminder_sent_at\` datetime(3) NULL,
        \`version\` int NOT NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        INDEX \`IDX_appointments_shop_start\` (\`shop_id\`, \`start_at\`),
        INDEX \`IDX_appointments_rider_start\` (\`rider_id\`, \`start_at\`),
        INDEX \`IDX_appointments_status_hold\` (\`status\`, \`hold_expires_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`appointment_cells\` (
        \`shop_id\` uuid NOT NULL,
        \`bench\` tinyint UNSIGNED NOT NULL,
        \`cell_at\` datetime NOT NULL,
        \`appointment_id\` uuid NOT NULL,
        INDEX \`IDX_appointment_cells_appointment\` (\`appointment_id\`),
        PRIMARY KEY (\`shop_id\`, \`bench\`, \`cell_at\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`appointment_events\` (
        \`id\` uuid NOT NULL,
        \`appointment_id\` uuid NOT NULL,
        \`event\` varchar(32) NOT NULL,
        \`actor_id\` uuid NULL,
        \`detail\` json NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_appointment_events_appointment\` (\`appointment_id\`, \`created_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    const fk = (table: string, name: string, column: string, ref: string, onDelete: string) =>
      q.query(
        `ALTER TABLE \`${table}\` ADD CONSTRAINT \`${name}\` FOREIGN KEY (\`${column}\`) REFERENCES \`${ref}\`(\`id\`) ON DELETE ${onDelete} ON UPDATE NO ACTION`,
      );
    await fk('shop_opening_intervals', 'FK_shop_opening_intervals_shop', 'shop_id', 'shops', 'CASCADE');
    await fk('shop_closures', 'FK_shop_closures_shop', 'shop_id', 'shops', 'CASCADE');
    await fk('shop_services', 'FK_shop_services_shop', 'shop_id', 'shops', 'CASCADE');
    await fk('appointments', 'FK_appointments_shop', 'shop_id', 'shops', 'RESTRICT');
    await fk('appointments', 'FK_appointments_service', 'service_id', 'shop_services', 'RESTRICT');
    await fk('appointments', 'FK_appointments_rider', 'rider_id', 'users', 'CASCADE');
    await fk(
      'appointment_cells',
      'FK_appointment_cells_appointment',
      'appointment_id',
      'appointments',
      'CASCADE',
    );
    await fk(
      'appointment_events',
      'FK_appointment_events_appointment',
      'appointment_id',
      'appointments',
      'CASCADE',
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    for (const [table, fk] of [
      ['appointment_events', 'FK_appointment_events_appointment'],
      ['appointment_cells', 'FK_appointment_cells_appointment'],
      ['appointments', 'FK_appointments_rider'],
      ['appointments', 'FK_appointments_service'],
      ['appointments', 'FK_appointments_shop'],
      ['shop_services', 'FK_shop_services_shop'],
      ['shop_closures', 'FK_shop_closures_shop'],
      ['shop_opening_intervals', 'FK_shop_opening_intervals_shop'],
    ]) {
      await q.query(`ALTER TABLE \`${table}\` DROP FOREIGN KEY \`${fk}\``);
    }
    for (const table of [
      'appointment_events',
      'appointment_cells',
      'appointments',
      'shop_services',
      'shop_closures',
      'shop_opening_intervals',
    ]) {
      await q.query(`DROP TABLE \`${table}\``);
    }
    await q.query(
      `ALTER TABLE \`shops\` DROP COLUMN \`calendar_token_hash\`, DROP COLUMN \`cancellation_window_hours\`,
        DROP COLUMN \`hold_minutes\`, DROP COLUMN \`max_days_ahead\`, DROP COLUMN \`min_notice_minutes\`,
        DROP COLUMN \`slot_step_minutes\`, DROP COLUMN \`benches\``,
    );
  }
}
