import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * What the lab tells its clients and how: the lab's contact e-mail and phone, its logo (printed on
 * reports), where samples are shipped and how; a reply address on every queued e-mail (the lab's
 * contact, so "reply to this message" reaches a person); and the client's in-app notifications,
 * one row per recipient user.
 */
export class LabContactAndNotifications1796184000000 implements MigrationInterface {
  name = 'LabContactAndNotifications1796184000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE lab
        ADD COLUMN IF NOT EXISTS contact_email text NOT NULL DEFAULT '',
        ADD COLUMN IF NOT EXISTS contact_phone text NOT NULL DEFAULT '',
        ADD COLUMN IF NOT EXISTS shipping_address text NOT NULL DEFAULT '',
        ADD COLUMN IF NOT EXISTS shipping_instructions text NOT NULL DEFAULT '',
        ADD COLUMN IF NOT EXISTS logo bytea,
        ADD COLUMN IF NOT EXISTS logo_content_type text CHECK (logo_content_type IN ('image/png', 'image/jpeg')),
        ADD COLUMN IF NOT EXISTS logo_width_px integer,
        ADD COLUMN IF NOT EXISTS logo_height_px integer,
        ADD COLUMN IF NOT EXISTS logo_updated_at timestamptz;

      ALTER TABLE email_outbox ADD COLUMN IF NOT EXISTS reply_to text;

      CREATE TABLE client_notification (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        entry_no bigint GENERATED ALWAYS AS IDENTITY,
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        user_id uuid NOT NULL REFERENCES app_user(id),
        event text NOT NULL,
        subject text NOT NULL,
        body text NOT NULL,
        link text,
        read_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX client_notification_user_idx ON client_notification (lab_id, user_id, created_at DESC, entry_no DESC);
      CREATE INDEX client_notification_unread_idx ON client_notification (lab_id, user_id) WHERE read_at IS NULL;
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE client_notification;
      ALTER TABLE email_outbox DROP COLUMN reply_to;
      ALTER TABLE lab
        DROP COLUMN logo_updated_at, DROP COLUMN logo_height_px, DROP COLUMN logo_width_px, DROP COLUMN logo_content_type, DROP COLUMN logo,
        DROP COLUMN shipping_instructions, DROP COLUMN shipping_address,
        DROP COLUMN contact_phone, DROP COLUMN contact_email;
    `);
  }
}
