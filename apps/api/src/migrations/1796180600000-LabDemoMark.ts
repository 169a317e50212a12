import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Marks a lab whose data is invented for demonstration. Reports it issues then carry the
 * demonstration mark on every page, so a demo report can never pass for a real test.
 * The seed sets it for its demo labs; every other lab stays unmarked.
 */
export class LabDemoMark1796180600000 implements MigrationInterface {
  name = 'LabDemoMark1796180600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE lab ADD COLUMN is_demo boolean NOT NULL DEFAULT false`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE lab DROP COLUMN is_demo`);
  }
}
