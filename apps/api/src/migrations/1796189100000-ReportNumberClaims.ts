import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Report numbers are claimed in a short transaction of their own before the report is rendered,
 * so the lab's counter row is locked only for the moment a number is taken. A claim is `held`
 * until the issuing transaction marks it `issued`; a held claim left behind by a failed issuance
 * is handed to the next one, so numbers stay unique and without gaps.
 */
export class ReportNumberClaims1796189100000 implements MigrationInterface {
  name = 'ReportNumberClaims1796189100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE report_number_claim (
        lab_id uuid NOT NULL REFERENCES lab(id),
        year integer NOT NULL CHECK (year BETWEEN 2000 AND 9999),
        value integer NOT NULL CHECK (value > 0),
        state text NOT NULL CHECK (state IN ('held', 'issued')),
        held_at timestamptz NOT NULL DEFAULT now(),
        holder_pid integer NOT NULL,
        report_id uuid REFERENCES test_report(id),
        PRIMARY KEY (lab_id, year, value),
        CHECK ((state = 'issued') = (report_id IS NOT NULL))
      );
      CREATE INDEX report_number_claim_held_idx ON report_number_claim (lab_id, year, value) WHERE state = 'held';
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE report_number_claim`);
  }
}
