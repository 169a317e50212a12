import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * What ordering, libraries and validation share: a sample is either a check of a suspect item or an
 * authentic reference lot the producer enrolled (with what the producer declared about it); a
 * library lot remembers the sample it was measured from and the chemistry known for it; a lab prices
 * its work in credits per check sample and per reference lot.
 */
export class ReferenceLotSeams1796181100000 implements MigrationInterface {
  name = 'ReferenceLotSeams1796181100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE sample
        ADD COLUMN kind text NOT NULL DEFAULT 'check' CHECK (kind IN ('check', 'reference-lot')),
        ADD COLUMN reference_lot jsonb,
        ADD CONSTRAINT sample_reference_lot_declared CHECK ((kind = 'reference-lot') = (reference_lot IS NOT NULL));
      CREATE INDEX sample_kind_idx ON sample (lab_id, kind, state);

      ALTER TABLE reference_lot DISABLE TRIGGER reference_lot_frozen;
      ALTER TABLE reference_lot
        ADD COLUMN sample_id uuid REFERENCES sample(id),
        ADD COLUMN chemistry jsonb NOT NULL DEFAULT '{}';
      ALTER TABLE reference_lot ENABLE TRIGGER reference_lot_frozen;

      ALTER TABLE lab
        ADD COLUMN credits_per_check_sample integer NOT NULL DEFAULT 1 CHECK (credits_per_check_sample >= 1),
        ADD COLUMN credits_per_reference_lot integer NOT NULL DEFAULT 1 CHECK (credits_per_reference_lot >= 0);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE lab DROP COLUMN credits_per_reference_lot, DROP COLUMN credits_per_check_sample;
      ALTER TABLE reference_lot DISABLE TRIGGER reference_lot_frozen;
      ALTER TABLE reference_lot DROP COLUMN chemistry, DROP COLUMN sample_id;
      ALTER TABLE reference_lot ENABLE TRIGGER reference_lot_frozen;
      DROP INDEX sample_kind_idx;
      ALTER TABLE sample DROP CONSTRAINT sample_reference_lot_declared, DROP COLUMN reference_lot, DROP COLUMN kind;
    `);
  }
}
