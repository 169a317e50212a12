import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A lab's own intake limits per matrix (arrival temperature, sample age); null keeps Ohmprint's defaults. */
export class IntakeLimits1796181200000 implements MigrationInterface {
  name = 'IntakeLimits1796181200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE lab ADD COLUMN intake_limits jsonb`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE lab DROP COLUMN intake_limits`);
  }
}
