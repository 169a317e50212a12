import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Versioned methods per matrix, and what building a library needs: a library version names the
 * method version it was built under, can be retired (a retired version stays readable and
 * reproducible but takes no new analyses), and each of its lots carries its quality and whether
 * it is included (an excluded lot keeps the reason). A method version that an issued report
 * relied on can never change: a trigger refuses it.
 */
export class MethodVersionsAndLibraryBuild1796187000000 implements MigrationInterface {
  name = 'MethodVersionsAndLibraryBuild1796187000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE method (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
        matrix text NOT NULL CHECK (matrix IN ('wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine')),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX method_name_key ON method (lab_id, lower(name));

      CREATE TABLE method_version (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        method_id uuid NOT NULL REFERENCES method(id),
        version integer NOT NULL CHECK (version >= 1),
        settings jsonb NOT NULL,
        note text NOT NULL DEFAULT '',
        created_by_user_id uuid REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX method_version_key ON method_version (lab_id, method_id, version);

      ALTER TABLE library_version DISABLE TRIGGER library_version_frozen;
      ALTER TABLE library_version
        ADD COLUMN method_version_id uuid REFERENCES method_version(id),
        ADD COLUMN retired_at timestamptz,
        ADD COLUMN retired_by_user_id uuid REFERENCES app_user(id),
        ADD COLUMN retirement_reason text,
        DROP CONSTRAINT library_version_status_check,
        ADD CONSTRAINT library_version_status_check CHECK (status IN ('draft', 'published', 'retired')),
        ADD CONSTRAINT library_version_retired_check CHECK ((status = 'retired') = (retired_at IS NOT NULL AND retirement_reason IS NOT NULL));
      ALTER TABLE library_version ENABLE TRIGGER library_version_frozen;
      CREATE INDEX library_version_method_idx ON library_version (lab_id, method_version_id);

      -- Published is frozen; the one change left is retiring it, and that touches only the retirement columns.
      CREATE OR REPLACE FUNCTION library_version_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'UPDATE' AND OLD.status = 'published' AND NEW.status = 'retired'
           AND (to_jsonb(NEW) - 'status' - 'retired_at' - 'retired_by_user_id' - 'retirement_reason')
             = (to_jsonb(OLD) - 'status' - 'retired_at' - 'retired_by_user_id' - 'retirement_reason') THEN
          RETURN NEW;
        END IF;
        IF OLD.status IN ('published', 'retired') THEN
          RAISE EXCEPTION 'library version % is % and frozen: % refused', OLD.id, OLD.status, TG_OP
            USING ERRCODE = 'insufficient_privilege';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$;

      CREATE OR REPLACE FUNCTION reference_lot_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE
        version_status text;
      BEGIN
        SELECT status INTO version_status FROM library_version
          WHERE id = COALESCE(NEW.library_version_id, OLD.library_version_id);
        IF version_status IN ('published', 'retired') THEN
          RAISE EXCEPTION 'reference lots of a % library version are frozen: % refused', version_status, TG_OP
            USING ERRCODE = 'insufficient_privilege';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$;

      ALTER TABLE reference_lot DISABLE TRIGGER reference_lot_frozen;
      ALTER TABLE reference_lot
        ADD COLUMN included boolean NOT NULL DEFAULT true,
        ADD COLUMN exclusion_reason text,
        ADD COLUMN quality jsonb NOT NULL DEFAULT '{}',
        ADD CONSTRAINT reference_lot_exclusion_check CHECK (included OR exclusion_reason IS NOT NULL);
      ALTER TABLE reference_lot ENABLE TRIGGER reference_lot_frozen;
      CREATE INDEX reference_lot_version_idx ON reference_lot (lab_id, library_version_id, included);

      CREATE FUNCTION method_version_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF EXISTS (
          SELECT 1 FROM test_report r
          JOIN analysis a ON a.id = r.analysis_id
          JOIN library_version v ON v.id = a.library_version_id
          WHERE v.method_version_id = OLD.id
        ) THEN
          RAISE EXCEPTION 'method version % was used by an issued report: % refused', OLD.id, TG_OP
            USING ERRCODE = 'insufficient_privilege';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$;
      CREATE TRIGGER method_version_frozen_when_reported BEFORE UPDATE OR DELETE ON method_version
        FOR EACH ROW EXECUTE FUNCTION method_version_refuse_change();
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TRIGGER method_version_frozen_when_reported ON method_version;
      DROP FUNCTION method_version_refuse_change();
      DROP INDEX reference_lot_version_idx;
      ALTER TABLE reference_lot DISABLE TRIGGER reference_lot_frozen;
      ALTER TABLE reference_lot DROP CONSTRAINT reference_lot_exclusion_check,
        DROP COLUMN quality, DROP COLUMN exclusion_reason, DROP COLUMN included;
      ALTER TABLE reference_lot ENABLE TRIGGER reference_lot_frozen;
      CREATE OR REPLACE FUNCTION reference_lot_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE
        version_status text;
      BEGIN
        SELECT status INTO version_status FROM library_version
          WHERE id = COALESCE(NEW.library_version_id, OLD.library_version_id);
        IF version_status = 'published' THEN
          RAISE EXCEPTION 'reference lots of a published library version are frozen: % refused', TG_OP
            USING ERRCODE = 'insufficient_privilege';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$;
      CREATE OR REPLACE FUNCTION library_version_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.status = 'published' THEN
          RAISE EXCEPTION 'library version % is published and frozen: % refused', OLD.id, TG_OP
            USING ERRCODE = 'insufficient_privilege';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$;
      DROP INDEX library_version_method_idx;
      ALTER TABLE library_version DISABLE TRIGGER library_version_frozen;
      ALTER TABLE library_version DROP CONSTRAINT library_version_retired_check,
        DROP CONSTRAINT library_version_status_check,
        DROP COLUMN retirement_reason, DROP COLUMN retired_by_user_id, DROP COLUMN retired_at, DROP COLUMN method_version_id;
      ALTER TABLE library_version ADD CONSTRAINT library_version_status_check CHECK (status IN ('draft', 'published'));
      ALTER TABLE library_version ENABLE TRIGGER library_version_frozen;
      DROP TABLE method_version;
      DROP TABLE method;
    `);
  }
}
