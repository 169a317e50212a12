import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Tenants, people, roles, sign-in sessions, invitations, audit trail and the e-mail outbox. */
export class Accounts1796180000000 implements MigrationInterface {
  name = 'Accounts1796180000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE lab (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name text NOT NULL,
        legal_name text NOT NULL,
        address text NOT NULL,
        accreditation_body text,
        accreditation_number text,
        turnaround_target_days integer NOT NULL DEFAULT 10 CHECK (turnaround_target_days BETWEEN 1 AND 365),
        status text NOT NULL DEFAULT 'active' CHECK (status IN ('active', 'suspended')),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX lab_name_key ON lab (lower(name));

      CREATE TABLE app_user (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid REFERENCES lab(id),
        email text NOT NULL CHECK (email = lower(email)),
        display_name text NOT NULL,
        password_hash text NOT NULL,
        is_platform_operator boolean NOT NULL DEFAULT false,
        status text NOT NULL DEFAULT 'active' CHECK (status IN ('active', 'deactivated')),
        last_sign_in_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (is_platform_operator = (lab_id IS NULL))
      );
      CREATE UNIQUE INDEX app_user_email_key ON app_user (email);
      CREATE INDEX app_user_lab_idx ON app_user (lab_id, created_at);

      CREATE TABLE lab_role_membership (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        user_id uuid NOT NULL REFERENCES app_user(id) ON DELETE CASCADE,
        role text NOT NULL CHECK (role IN ('lab-admin', 'intake-technician', 'analyst', 'reviewer')),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX lab_role_membership_key ON lab_role_membership (lab_id, user_id, role);
      CREATE INDEX lab_role_membership_user_idx ON lab_role_membership (user_id);

      CREATE TABLE client_organisation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        name text NOT NULL,
        contact_email text,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX client_organisation_name_key ON client_organisation (lab_id, lower(name));

      CREATE TABLE client_membership (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        user_id uuid NOT NULL REFERENCES app_user(id) ON DELETE CASCADE,
        role text NOT NULL CHECK (role IN ('client-admin', 'client-member')),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX client_membership_user_key ON client_membership (user_id);
      CREATE INDEX client_membership_org_idx ON client_membership (lab_id, client_organisation_id);

      CREATE TABLE invitation (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid REFERENCES client_organisation(id),
        email text NOT NULL CHECK (email = lower(email)),
        display_name text,
        roles text[] NOT NULL CHECK (cardinality(roles) > 0),
        token_hash text NOT NULL,
        invited_by_user_id uuid REFERENCES app_user(id),
        expires_at timestamptz NOT NULL,
        accepted_at timestamptz,
        accepted_user_id uuid REFERENCES app_user(id),
        revoked_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX invitation_token_key ON invitation (token_hash);
      CREATE INDEX invitation_lab_idx ON invitation (lab_id, client_organisation_id, created_at);

      CREATE TABLE refresh_session (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid REFERENCES lab(id),
        user_id uuid NOT NULL REFERENCES app_user(id) ON DELETE CASCADE,
        family_id uuid NOT NULL,
        token_hash text NOT NULL,
        expires_at timestamptz NOT NULL,
        rotated_at timestamptz,
        revoked_at timestamptz,
        revoked_reason text,
        user_agent text,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX refresh_session_token_key ON refresh_session (token_hash);
      CREATE INDEX refresh_session_lab_idx ON refresh_session (lab_id, user_id);
      CREATE INDEX refresh_session_family_idx ON refresh_session (family_id);

      CREATE TABLE password_reset_token (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid REFERENCES lab(id),
        user_id uuid NOT NULL REFERENCES app_user(id) ON DELETE CASCADE,
        token_hash text NOT NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX password_reset_token_key ON password_reset_token (token_hash);
      CREATE INDEX password_reset_token_lab_idx ON password_reset_token (lab_id, user_id);

      CREATE TABLE audit_event (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid REFERENCES lab(id),
        actor_user_id uuid REFERENCES app_user(id),
        action text NOT NULL,
        subject_type text NOT NULL,
        subject_id text,
        details jsonb NOT NULL DEFAULT '{}'::jsonb,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX audit_event_lab_idx ON audit_event (lab_id, created_at);
      CREATE INDEX audit_event_subject_idx ON audit_event (lab_id, subject_type, subject_id);

      CREATE TABLE email_outbox (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid REFERENCES lab(id),
        to_address text NOT NULL,
        subject text NOT NULL,
        text_body text NOT NULL,
        html_body text,
        status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'sent', 'failed')),
        attempts integer NOT NULL DEFAULT 0,
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        last_error text,
        sent_at timestamptz,
        message_id text,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX email_outbox_lab_idx ON email_outbox (lab_id, created_at);
      CREATE INDEX email_outbox_due_idx ON email_outbox (next_attempt_at) WHERE status = 'pending';
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE email_outbox; DROP TABLE audit_event; DROP TABLE password_reset_token;
      DROP TABLE refresh_session; DROP TABLE invitation; DROP TABLE client_membership;
      DROP TABLE client_organisation; DROP TABLE lab_role_membership; DROP TABLE app_user; DROP TABLE lab;
    `);
  }
}
