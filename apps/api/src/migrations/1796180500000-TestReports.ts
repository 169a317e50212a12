import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Issued test reports (the signed PDF itself in bytea, with its SHA-256) and their numbering.
 * Numbers are unique across labs because the public page looks reports up by number alone: each
 * lab owns a distinct prefix, and a per-lab, per-year counter row is locked by the issuing
 * transaction, so numbers have no gaps and no duplicates.
 */
export class TestReports1796180500000 implements MigrationInterface {
  name = 'TestReports1796180500000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE report_numbering (
        lab_id uuid PRIMARY KEY REFERENCES lab(id),
        prefix text NOT NULL CHECK (prefix ~ '^[A-Z]{2,4}[0-9]{0,3}$'),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX report_numbering_prefix_key ON report_numbering (prefix);

      CREATE TABLE report_number_sequence (
        lab_id uuid NOT NULL REFERENCES lab(id),
        year integer NOT NULL CHECK (year BETWEEN 2000 AND 9999),
        last_value integer NOT NULL CHECK (last_value >= 0),
        PRIMARY KEY (lab_id, year)
      );

      CREATE TABLE test_report (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        analysis_id uuid NOT NULL REFERENCES analysis(id),
        sample_id uuid NOT NULL REFERENCES sample(id),
        number text NOT NULL,
        base_number text NOT NULL,
        revision integer NOT NULL DEFAULT 0 CHECK (revision >= 0),
        replaces_report_id uuid REFERENCES test_report(id),
        superseded_by_report_id uuid REFERENCES test_report(id),
        status text NOT NULL DEFAULT 'issued' CHECK (status IN ('issued', 'superseded', 'revoked')),
        verdict text NOT NULL CHECK (verdict IN ('consistent', 'inconclusive', 'not-consistent', 'no-verdict')),
        sample_code text NOT NULL,
        product_name text NOT NULL,
        issued_at timestamptz NOT NULL,
        issued_by_user_id uuid NOT NULL REFERENCES app_user(id),
        amendment_reason text,
        revoked_at timestamptz,
        revoked_by_user_id uuid REFERENCES app_user(id),
        revocation_reason text,
        verification_code text NOT NULL,
        sha256 text NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
        pdf bytea NOT NULL,
        pdf_size integer NOT NULL,
        content jsonb NOT NULL,
        signing_credential_id uuid NOT NULL REFERENCES signing_credential(id),
        CHECK ((revision = 0) = (replaces_report_id IS NULL)),
        CHECK ((status = 'revoked') = (revoked_at IS NOT NULL)),
        CHECK ((status = 'superseded') = (superseded_by_report_id IS NOT NULL))
      );
      CREATE UNIQUE INDEX test_report_number_key ON test_report (number);
      CREATE UNIQUE INDEX test_report_revision_key ON test_report (lab_id, base_number, revision);
      CREATE UNIQUE INDEX test_report_first_per_analysis_key ON test_report (lab_id, analysis_id) WHERE revision = 0;
      CREATE INDEX test_report_lab_idx ON test_report (lab_id, issued_at);
      CREATE INDEX test_report_client_idx ON test_report (lab_id, client_organisation_id, issued_at);
      CREATE INDEX test_report_sha256_idx ON test_report (sha256);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE test_report; DROP TABLE report_number_sequence; DROP TABLE report_numbering;`);
  }
}
