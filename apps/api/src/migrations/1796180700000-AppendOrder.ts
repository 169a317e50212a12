import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Rows written in one transaction share their timestamps, because now() is fixed for a
 * transaction: the accepted and stored custody events of one intake, the photos of one upload.
 * An identity column keeps the order in which they were appended, so the custody timeline never
 * swaps two events and photos stay in the order the technician dropped them. Existing rows are
 * numbered in table order, which for these append-only tables is the order they were written.
 */
export class AppendOrder1796180700000 implements MigrationInterface {
  name = 'AppendOrder1796180700000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE custody_event ADD COLUMN entry_no bigint GENERATED ALWAYS AS IDENTITY`);
    await q.query(`ALTER TABLE intake_photo ADD COLUMN entry_no bigint GENERATED ALWAYS AS IDENTITY`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE intake_photo DROP COLUMN entry_no`);
    await q.query(`ALTER TABLE custody_event DROP COLUMN entry_no`);
  }
}
