import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * What each instrument export said about itself when it was uploaded (sample code in its name and
 * metadata, temperature, instrument, date) and how the upload treated it; where the measurement
 * temperature came from. Uploads made before this change have no record (NULL), which the screens
 * show as "not read".
 */
export class ReplicateDeclared1796186000000 implements MigrationInterface {
  name = 'ReplicateDeclared1796186000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE replicate
        ADD COLUMN declared jsonb,
        ADD COLUMN temperature_source text NOT NULL DEFAULT 'entered' CHECK (temperature_source IN ('entered', 'file', 'entered-over-file'));
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE replicate DROP COLUMN temperature_source, DROP COLUMN declared`);
  }
}
