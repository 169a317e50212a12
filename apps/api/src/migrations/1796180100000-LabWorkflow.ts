import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The lab workflow: products and orders with their samples, intake and chain of custody,
 * bench equipment and measurements, instrument keys, reference libraries, analyses and reviews.
 * Custody events and published library versions are protected by triggers, so not even a
 * direct SQL session can rewrite them.
 */
export class LabWorkflow1796180100000 implements MigrationInterface {
  name = 'LabWorkflow1796180100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE product (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        name text NOT NULL,
        matrix text NOT NULL CHECK (matrix IN ('wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine')),
        description text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX product_name_key ON product (lab_id, client_organisation_id, lower(name));

      CREATE TABLE test_order (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        product_id uuid NOT NULL REFERENCES product(id),
        status text NOT NULL DEFAULT 'placed' CHECK (status IN ('placed', 'in-progress', 'completed', 'cancelled')),
        placed_by_user_id uuid NOT NULL REFERENCES app_user(id),
        credits_reserved integer NOT NULL DEFAULT 0 CHECK (credits_reserved >= 0),
        placed_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX test_order_client_idx ON test_order (lab_id, client_organisation_id, placed_at);

      CREATE TABLE sample (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        order_id uuid NOT NULL REFERENCES test_order(id),
        code text NOT NULL CHECK (code ~ '^OP-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{2}$'),
        state text NOT NULL DEFAULT 'awaiting-arrival' CHECK (state IN ('awaiting-arrival', 'received', 'accepted',
          'rejected', 'measuring', 'analysed', 'in-review', 'returned-for-rework', 'reported')),
        obtained_where text NOT NULL,
        obtained_on date NOT NULL,
        label_text text NOT NULL DEFAULT '',
        claimed_lot text NOT NULL DEFAULT '',
        storage_location text,
        rejection_reason text,
        received_at timestamptz,
        state_changed_at timestamptz NOT NULL DEFAULT now(),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX sample_code_key ON sample (code);
      CREATE INDEX sample_queue_idx ON sample (lab_id, state, received_at);
      CREATE INDEX sample_order_idx ON sample (lab_id, order_id);

      CREATE TABLE sample_intake (
        sample_id uuid PRIMARY KEY REFERENCES sample(id),
        lab_id uuid NOT NULL REFERENCES lab(id),
        carrier text NOT NULL,
        tracking_number text NOT NULL DEFAULT '',
        arrived_at timestamptz NOT NULL,
        temperature_c double precision NOT NULL,
        seal_intact boolean NOT NULL,
        container_condition text NOT NULL CHECK (container_condition IN ('intact', 'damaged', 'leaking', 'unlabelled')),
        volume_ml double precision NOT NULL CHECK (volume_ml > 0),
        notes text NOT NULL DEFAULT '',
        recorded_by_user_id uuid NOT NULL REFERENCES app_user(id),
        recorded_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX sample_intake_lab_idx ON sample_intake (lab_id, arrived_at);

      CREATE TABLE intake_photo (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        sample_id uuid NOT NULL REFERENCES sample(id),
        file_name text NOT NULL,
        content_type text NOT NULL,
        size_bytes integer NOT NULL,
        content bytea NOT NULL,
        uploaded_by_user_id uuid NOT NULL REFERENCES app_user(id),
        uploaded_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX intake_photo_sample_idx ON intake_photo (lab_id, sample_id);

      CREATE TABLE custody_event (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        sample_id uuid NOT NULL REFERENCES sample(id),
        kind text NOT NULL CHECK (kind IN ('received', 'accepted', 'rejected', 'stored', 'moved',
          'taken-for-measurement', 'returned-to-storage', 'sent-out', 'disposed')),
        location text NOT NULL,
        reason text NOT NULL,
        actor_user_id uuid NOT NULL REFERENCES app_user(id),
        occurred_at timestamptz NOT NULL,
        recorded_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX custody_event_sample_idx ON custody_event (lab_id, sample_id, occurred_at);
      CREATE FUNCTION custody_event_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'custody events are append-only: % refused on custody_event', TG_OP
          USING ERRCODE = 'insufficient_privilege';
      END $$;
      CREATE TRIGGER custody_event_append_only BEFORE UPDATE OR DELETE ON custody_event
        FOR EACH ROW EXECUTE FUNCTION custody_event_refuse_change();

      CREATE TABLE instrument (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        name text NOT NULL,
        model text NOT NULL DEFAULT '',
        serial_number text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX instrument_name_key ON instrument (lab_id, lower(name));

      CREATE TABLE measurement_cell (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        name text NOT NULL,
        nominal_constant_per_cm double precision NOT NULL CHECK (nominal_constant_per_cm > 0),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX measurement_cell_name_key ON measurement_cell (lab_id, lower(name));

      CREATE TABLE cell_calibration (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        cell_id uuid NOT NULL REFERENCES measurement_cell(id),
        standard_name text NOT NULL,
        standard_conductivity_us_per_cm double precision NOT NULL CHECK (standard_conductivity_us_per_cm > 0),
        standard_temperature_c double precision NOT NULL,
        plateau_resistance_ohm double precision NOT NULL CHECK (plateau_resistance_ohm > 0),
        cell_constant_per_cm double precision NOT NULL CHECK (cell_constant_per_cm > 0),
        measured_at timestamptz NOT NULL,
        measured_by_user_id uuid NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX cell_calibration_cell_idx ON cell_calibration (lab_id, cell_id, measured_at);

      CREATE TABLE instrument_key (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        name text NOT NULL,
        prefix text NOT NULL,
        secret_sha256 text NOT NULL,
        created_by_user_id uuid NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        last_used_at timestamptz,
        revoked_at timestamptz,
        revoked_by_user_id uuid REFERENCES app_user(id)
      );
      CREATE UNIQUE INDEX instrument_key_secret_key ON instrument_key (secret_sha256);
      CREATE INDEX instrument_key_lab_idx ON instrument_key (lab_id, created_at);

      CREATE TABLE replicate (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        sample_id uuid NOT NULL REFERENCES sample(id),
        replicate_number integer NOT NULL CHECK (replicate_number >= 1),
        file_name text NOT NULL,
        raw_file bytea NOT NULL,
        frequency_hz double precision[] NOT NULL,
        re double precision[] NOT NULL,
        im double precision[] NOT NULL,
        instrument_id uuid NOT NULL REFERENCES instrument(id),
        cell_id uuid NOT NULL REFERENCES measurement_cell(id),
        cell_constant_per_cm double precision NOT NULL CHECK (cell_constant_per_cm > 0),
        cell_constant_source text NOT NULL CHECK (cell_constant_source IN ('entered', 'latest-calibration')),
        calibration_id uuid REFERENCES cell_calibration(id),
        temperature_c double precision NOT NULL,
        kramers_kronig jsonb NOT NULL,
        excluded boolean NOT NULL DEFAULT false,
        exclusion_reason text,
        excluded_by_user_id uuid REFERENCES app_user(id),
        excluded_at timestamptz,
        via text NOT NULL CHECK (via IN ('portal', 'instrument-key')),
        uploaded_by_user_id uuid REFERENCES app_user(id),
        instrument_key_id uuid REFERENCES instrument_key(id),
        uploaded_at timestamptz NOT NULL DEFAULT now(),
        CHECK (uploaded_by_user_id IS NOT NULL OR instrument_key_id IS NOT NULL),
        CHECK (NOT excluded OR exclusion_reason IS NOT NULL)
      );
      CREATE UNIQUE INDEX replicate_number_key ON replicate (lab_id, sample_id, replicate_number);

      CREATE TABLE method_settings (
        lab_id uuid PRIMARY KEY REFERENCES lab(id),
        settings jsonb NOT NULL,
        updated_by_user_id uuid REFERENCES app_user(id),
        updated_at timestamptz NOT NULL DEFAULT now()
      );

      CREATE TABLE reference_library (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        product_id uuid NOT NULL REFERENCES product(id),
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX reference_library_product_key ON reference_library (lab_id, product_id);

      CREATE TABLE library_version (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        library_id uuid NOT NULL REFERENCES reference_library(id),
        version integer NOT NULL CHECK (version >= 1),
        status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'published')),
        method jsonb NOT NULL,
        grid_hz double precision[] NOT NULL,
        calibration jsonb,
        engine_version text NOT NULL,
        published_at timestamptz,
        published_by_user_id uuid REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        CHECK (status = 'draft' OR (calibration IS NOT NULL AND published_at IS NOT NULL))
      );
      CREATE UNIQUE INDEX library_version_key ON library_version (lab_id, library_id, version);

      -- Each lot's spectrum is stored normalised and on the version's grid, as little-endian
      -- float64 values: the real parts, then the imaginary parts.
      CREATE TABLE reference_lot (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        library_version_id uuid NOT NULL REFERENCES library_version(id),
        lot_code text NOT NULL,
        produced_on date,
        note text NOT NULL DEFAULT '',
        spectrum bytea NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX reference_lot_code_key ON reference_lot (lab_id, library_version_id, lot_code);

      CREATE FUNCTION library_version_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.status = 'published' THEN
          RAISE EXCEPTION 'library version % is published and frozen: % refused', OLD.id, TG_OP
            USING ERRCODE = 'insufficient_privilege';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$;
      CREATE TRIGGER library_version_frozen BEFORE UPDATE OR DELETE ON library_version
        FOR EACH ROW EXECUTE FUNCTION library_version_refuse_change();

      CREATE FUNCTION reference_lot_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
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
      CREATE TRIGGER reference_lot_frozen BEFORE INSERT OR UPDATE OR DELETE ON reference_lot
        FOR EACH ROW EXECUTE FUNCTION reference_lot_refuse_change();

      CREATE TABLE analysis (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        sample_id uuid NOT NULL REFERENCES sample(id),
        library_version_id uuid NOT NULL REFERENCES library_version(id),
        status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'submitted', 'approved', 'returned', 'superseded')),
        verdict text NOT NULL CHECK (verdict IN ('consistent', 'inconclusive', 'not-consistent', 'no-verdict')),
        replicate_ids uuid[] NOT NULL,
        method jsonb NOT NULL,
        engine_version text NOT NULL,
        result jsonb NOT NULL,
        sample_spectrum jsonb NOT NULL,
        remarks text NOT NULL DEFAULT '',
        analyst_user_id uuid NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        submitted_at timestamptz
      );
      CREATE INDEX analysis_sample_idx ON analysis (lab_id, sample_id, created_at);
      CREATE INDEX analysis_status_idx ON analysis (lab_id, status, submitted_at);

      CREATE TABLE analysis_review (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        analysis_id uuid NOT NULL REFERENCES analysis(id),
        reviewer_user_id uuid NOT NULL REFERENCES app_user(id),
        decision text NOT NULL CHECK (decision IN ('approved', 'returned')),
        comments text NOT NULL DEFAULT '',
        report_id uuid,
        decided_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX analysis_review_analysis_idx ON analysis_review (lab_id, analysis_id, decided_at);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE analysis_review; DROP TABLE analysis;
      DROP TABLE reference_lot; DROP FUNCTION reference_lot_refuse_change();
      DROP TABLE library_version; DROP FUNCTION library_version_refuse_change();
      DROP TABLE reference_library; DROP TABLE method_settings;
      DROP TABLE replicate; DROP TABLE instrument_key; DROP TABLE cell_calibration;
      DROP TABLE measurement_cell; DROP TABLE instrument;
      DROP TABLE custody_event; DROP FUNCTION custody_event_refuse_change();
      DROP TABLE intake_photo; DROP TABLE sample_intake; DROP TABLE sample;
      DROP TABLE test_order; DROP TABLE product;
    `);
  }
}
