import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Control standards and method validation: a KCl standard run keeps its concentration, basis,
 * conductivity source and spectrum beside the cell constant; refused uploads on an out-of-control
 * cell are remembered; samples can be flagged as blind checks or declared mixtures; fitted
 * parameters of frozen library lots are cached; the demo's synthesised study results have a home.
 */
export class ControlStandardsAndValidation1796188000000 implements MigrationInterface {
  name = 'ControlStandardsAndValidation1796188000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE cell_calibration
        ADD COLUMN concentration double precision CHECK (concentration > 0),
        ADD COLUMN concentration_basis text CHECK (concentration_basis IN ('molal', 'molar')),
        ADD COLUMN conductivity_source text,
        ADD COLUMN resistance_source text NOT NULL DEFAULT 'entered' CHECK (resistance_source IN ('plateau', 'fit', 'entered')),
        ADD COLUMN file_name text,
        ADD COLUMN raw_file bytea,
        ADD COLUMN frequency_hz double precision[],
        ADD COLUMN re double precision[],
        ADD COLUMN im double precision[];

      CREATE TABLE cell_upload_refusal (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        cell_id uuid NOT NULL REFERENCES measurement_cell(id),
        sample_code text NOT NULL,
        rule text NOT NULL,
        refused_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX cell_upload_refusal_cell_idx ON cell_upload_refusal (lab_id, cell_id, refused_at);

      ALTER TABLE sample
        ADD COLUMN blind_check boolean NOT NULL DEFAULT false,
        ADD COLUMN declared_mixture jsonb;
      CREATE INDEX sample_validation_idx ON sample (lab_id) WHERE blind_check OR declared_mixture IS NOT NULL;

      CREATE TABLE lot_fit (
        lab_id uuid NOT NULL REFERENCES lab(id),
        lot_id uuid NOT NULL REFERENCES reference_lot(id),
        model text NOT NULL,
        parameters jsonb,
        reason text,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (lot_id, model)
      );
      CREATE INDEX lot_fit_lab_idx ON lot_fit (lab_id, lot_id);

      CREATE TABLE synthesised_trial (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        product_id uuid NOT NULL REFERENCES product(id),
        library_version_id uuid NOT NULL REFERENCES library_version(id),
        kind text NOT NULL CHECK (kind IN ('detection', 'blind-check')),
        admixture text CHECK (admixture IN ('water', 'other-product')),
        admixture_name text,
        level_percent double precision,
        reference text NOT NULL,
        verdict text NOT NULL CHECK (verdict IN ('consistent', 'inconclusive', 'not-consistent', 'no-verdict')),
        nearest_distance double precision,
        replicate_distances double precision[] NOT NULL DEFAULT '{}',
        decided_at timestamptz NOT NULL,
        CHECK ((kind = 'detection') = (admixture IS NOT NULL AND level_percent IS NOT NULL))
      );
      CREATE INDEX synthesised_trial_lab_idx ON synthesised_trial (lab_id, kind, product_id);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE synthesised_trial; DROP TABLE lot_fit;
      DROP INDEX sample_validation_idx;
      ALTER TABLE sample DROP COLUMN declared_mixture, DROP COLUMN blind_check;
      DROP TABLE cell_upload_refusal;
      ALTER TABLE cell_calibration DROP COLUMN im, DROP COLUMN re, DROP COLUMN frequency_hz, DROP COLUMN raw_file,
        DROP COLUMN file_name, DROP COLUMN resistance_source, DROP COLUMN conductivity_source,
        DROP COLUMN concentration_basis, DROP COLUMN concentration;
    `);
  }
}
