import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Service reports (issue 11): a checklist per service, the report of an appointment (draft, then
 * final), its attachments (photos and measured curves; the bytes live in the upload store) and
 * the spring fits made from the curves.
 */
export class ServiceReports1766100000000 implements MigrationInterface {
  name = 'ServiceReports1766100000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE `shop_services` ADD `checklist` json NULL');
    await q.query(
      `CREATE TABLE \`service_reports\` (
        \`appointment_id\` uuid NOT NULL,
        \`checklist\` json NOT NULL,
        \`notes\` varchar(4000) NOT NULL DEFAULT '',
        \`fork\` json NULL,
        \`shock\` json NULL,
        \`status\` enum ('draft', 'final') NOT NULL DEFAULT 'draft',
        \`updated_by\` uuid NULL,
        \`completed_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        \`version\` int NOT NULL,
        PRIMARY KEY (\`appointment_id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`appointment_attachments\` (
        \`id\` uuid NOT NULL,
        \`appointment_id\` uuid NOT NULL,
        \`kind\` enum ('photo', 'curve') NOT NULL,
        \`original_name\` varchar(200) NOT NULL,
        \`storage_key\` varchar(200) NOT NULL,
        \`thumbnail_key\` varchar(200) NULL,
        \`content_type\` varchar(100) NOT NULL,
        \`size_bytes\` int UNSIGNED NOT NULL,
        \`run\` json NULL,
        \`uploaded_by\` uuid NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        UNIQUE INDEX \`UQ_appointment_attachments_storage\` (\`storage_key\`),
        INDEX \`IDX_appointment_attachments_appointment\` (\`appointment_id\`, \`kind\`, \`created_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    await q.query(
      `CREATE TABLE \`spring_fits\` (
        \`id\` uuid NOT NULL,
        \`appointment_id\` uuid NOT NULL,
        \`part\` enum ('fork', 'shock') NOT NULL,
        \`result\` json NOT NULL,
        \`status\` enum ('proposed', 'stored', 'rejected') NOT NULL DEFAULT 'proposed',
        \`created_by\` uuid NULL,
        \`decided_at\` datetime(3) NULL,
        \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        INDEX \`IDX_spring_fits_appointment\` (\`appointment_id\`, \`part\`, \`created_at\`),
        PRIMARY KEY (\`id\`)
      ) ENGINE=InnoDB`,
    );
    const fk = (table: string, name: string, column: string, ref: string, onDelete: string) =>
      q.query(
        `ALTER TABLE \`${table}\` ADD CONSTRAINT \`${name}\` FOREIGN KEY (\`${column}\`) REFERENCES \`${ref}\`(\`id\`) ON DELETE ${onDelete} ON UPDATE NO ACTION`,
      );
    await fk(
      'service_reports',
      'FK_service_reports_appointment',
      'appointment_id',
      'appointments',
      'CASCADE',
    );
    await fk('service_reports', 'FK_service_reports_updated_by', 'updated_by', 'users', 'SET NULL');
    await fk(
      'appointment_attachments',
      'FK_appointment_attachments_appointment',
      'appointment_id',
      'appointments',
      'CASCADE',
    );
    await fk(
      'appointment_attachments',
      'FK_appointment_attachments_uploaded_by',
      'uploaded_by',
      'users',
      'SET NULL',
    );
    await fk('spring_fits', 'FK_spring_fits_appointment', 'appointment_id', 'appointments', 'CASCADE');
    await fk('spring_fits', 'FK_spring_fits_created_by', 'created_by', 'users', 'SET NULL');
  }

  public async down(q: QueryRunner): Promise<void> {
    for (const [t, k] of [
      ['spring_fits', 'FK_spring_fits_created_by'],
      ['spring_fits', 'FK_spring_fits_appointment'],
      ['appointment_attachments', 'FK_appointment_attachments_uploaded_by'],
      ['appointment_attachments', 'FK_appointment_attachments_appointment'],
      ['service_reports', 'FK_service_reports_updated_by'],
      ['service_reports', 'FK_service_reports_appointment'],
    ])
      await q.query(`ALTER TABLE \`${t}\` DROP FOREIGN KEY \`${k}\``);
    await q.query('DROP TABLE `spring_fits`');
    await q.query('DROP TABLE `appointment_attachments`');
    await q.query('DROP TABLE `service_reports`');
    await q.query('ALTER TABLE `shop_services` DROP COLUMN `checklist`');
  }
}
