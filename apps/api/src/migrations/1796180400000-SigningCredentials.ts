import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each lab's report-signing credentials. The PKCS#12 file and its passphrase are stored sealed
 * (AES-256-GCM, key outside the database); only the certificate's public facts are in clear.
 * At most one credential per lab is in use; replaced ones are kept (retired) because reports
 * signed with them still name them.
 */
export class SigningCredentials1796180400000 implements MigrationInterface {
  name = 'SigningCredentials1796180400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE signing_credential (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        origin text NOT NULL CHECK (origin IN ('development', 'uploaded')),
        sealed_p12 bytea NOT NULL,
        sealed_passphrase bytea NOT NULL,
        subject text NOT NULL,
        issuer text NOT NULL,
        serial_number text NOT NULL,
        fingerprint_sha256 text NOT NULL,
        not_before timestamptz NOT NULL,
        not_after timestamptz NOT NULL,
        uploaded_by_user_id uuid REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        retired_at timestamptz
      );
      CREATE UNIQUE INDEX signing_credential_in_use_key ON signing_credential (lab_id) WHERE retired_at IS NULL;
      CREATE INDEX signing_credential_lab_idx ON signing_credential (lab_id, created_at);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE signing_credential;`);
  }
}
