import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The first migration: the database itself speaks full Unicode (utf8mb4) from the start. */
export class Init1764626400000 implements MigrationInterface {
  name = 'Init1764626400000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    const [{ db }] = (await queryRunner.query('SELECT DATABASE() AS db')) as { db: string }[];
    await queryRunner.query(`ALTER DATABASE \`${db}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  }

  public async down(): Promise<void> {
    // Nothing to undo: the character set stays.
  }
}
