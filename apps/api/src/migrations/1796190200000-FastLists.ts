import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Lists stay fast at tens of thousands of rows:
 *  - indexes matching each list's tenant filter and sort (ties broken by a unique column), so a
 *    page is read in index order and a deep page skips index entries only;
 *  - `pg_trgm` GIN indexes for the `%…%` searches (a trusted extension since PostgreSQL 13: the
 *    database owner may create it);
 *  - `sample.placed_at`, the order's placement time copied by a trigger, so the work queue's
 *    "age" order (received, else placed) has an index on the sample table alone;
 *  - `library_version_tally`, each version's lot counts and thresholds kept by triggers, so the
 *    libraries list neither counts lots per version nor reads every version's calibration.
 */
export class FastLists1796190200000 implements MigrationInterface {
  name = 'FastLists1796190200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS pg_trgm`);

    await q.query(`ALTER TABLE sample ADD COLUMN placed_at timestamptz`);
    await q.query(`UPDATE sample s SET placed_at = o.placed_at FROM test_order o WHERE o.id = s.order_id`);
    await q.query(`ALTER TABLE sample ALTER COLUMN placed_at SET NOT NULL`);
    await q.query(`
      CREATE FUNCTION sample_copy_placed_at() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        SELECT o.placed_at INTO NEW.placed_at FROM test_order o WHERE o.id = NEW.order_id;
        RETURN NEW;
      END $$`);
    await q.query(`CREATE TRIGGER sample_placed_at BEFORE INSERT OR UPDATE OF order_id ON sample FOR EACH ROW EXECUTE FUNCTION sample_copy_placed_at()`);
    await q.query(`
      CREATE FUNCTION test_order_pass_placed_at() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        UPDATE sample SET placed_at = NEW.placed_at WHERE order_id = NEW.id AND lab_id = NEW.lab_id;
        RETURN NULL;
      END $$`);
    await q.query(`CREATE TRIGGER test_order_placed_at AFTER UPDATE OF placed_at ON test_order FOR EACH ROW
                   WHEN (OLD.placed_at IS DISTINCT FROM NEW.placed_at) EXECUTE FUNCTION test_order_pass_placed_at()`);

    for (const sql of [
      // work queue
      // covering: a deep page skips index entries without visiting the table
      `CREATE INDEX sample_age_idx ON sample (lab_id, (COALESCE(received_at, placed_at)), code) INCLUDE (state, order_id, id, received_at, placed_at)`,
      `CREATE INDEX sample_state_age_idx ON sample (lab_id, state, (COALESCE(received_at, placed_at)), code) INCLUDE (order_id, id, received_at, placed_at)`,
      `CREATE INDEX test_order_cancelled_idx ON test_order (lab_id, id) WHERE status = 'cancelled'`,
      `CREATE INDEX sample_lab_code_idx ON sample (lab_id, code)`,
      `CREATE INDEX sample_code_trgm_idx ON sample USING gin (code gin_trgm_ops)`,
      `CREATE INDEX sample_claimed_lot_trgm_idx ON sample USING gin (claimed_lot gin_trgm_ops)`,
      `CREATE INDEX sample_label_text_trgm_idx ON sample USING gin (label_text gin_trgm_ops)`,
      `CREATE INDEX test_order_product_idx ON test_order (lab_id, product_id)`,
      // client orders
      `CREATE INDEX test_order_client_page_idx ON test_order (lab_id, client_organisation_id, placed_at, id)`,
      // reports, lab and client
      `CREATE INDEX test_report_page_idx ON test_report (lab_id, issued_at, number) INCLUDE (id)`,
      `CREATE INDEX test_report_client_page_idx ON test_report (lab_id, client_organisation_id, issued_at, number) INCLUDE (id)`,
      `CREATE INDEX test_report_lab_number_idx ON test_report (lab_id, number)`,
      `CREATE INDEX test_report_number_trgm_idx ON test_report USING gin (number gin_trgm_ops)`,
      `CREATE INDEX test_report_sample_code_trgm_idx ON test_report USING gin (sample_code gin_trgm_ops)`,
      `CREATE INDEX test_report_product_name_trgm_idx ON test_report USING gin (product_name gin_trgm_ops)`,
      // analyses and the review queue
      `CREATE INDEX analysis_page_idx ON analysis (lab_id, created_at, id)`,
      `CREATE INDEX analysis_status_page_idx ON analysis (lab_id, status, created_at, id)`,
      `CREATE INDEX analysis_submitted_page_idx ON analysis (lab_id, submitted_at, id)`,
      // audit log
      `CREATE INDEX audit_event_page_idx ON audit_event (lab_id, created_at, id)`,
      `CREATE INDEX audit_event_action_trgm_idx ON audit_event USING gin (action gin_trgm_ops)`,
      // payments and ledger
      `CREATE INDEX payment_page_idx ON payment (lab_id, created_at, receipt_no) INCLUDE (id)`,
      `CREATE INDEX payment_client_page_idx ON payment (lab_id, client_organisation_id, created_at, receipt_no) INCLUDE (id)`,
      `CREATE INDEX credit_ledger_entry_page_idx ON credit_ledger_entry (lab_id, client_organisation_id, entry_no) INCLUDE (id)`,
      `CREATE INDEX credit_ledger_entry_sample_idx ON credit_ledger_entry (lab_id, sample_id) WHERE sample_id IS NOT NULL`,
      `CREATE INDEX credit_ledger_entry_reason_trgm_idx ON credit_ledger_entry USING gin (reason gin_trgm_ops)`,
    ]) {
      await q.query(sql);
    }

    await q.query(`
      CREATE TABLE library_version_tally (
        library_version_id uuid PRIMARY KEY REFERENCES library_version(id) ON DELETE CASCADE,
        lab_id uuid NOT NULL REFERENCES lab(id),
        lots integer NOT NULL DEFAULT 0 CHECK (lots >= 0),
        included_lots integer NOT NULL DEFAULT 0 CHECK (included_lots >= 0),
        t95 double precision,
        t99 double precision,
        threshold_estimator text
      )`);
    await q.query(`
      CREATE FUNCTION library_version_tally_thresholds() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        INSERT INTO library_version_tally (library_version_id, lab_id, t95, t99, threshold_estimator)
        VALUES (NEW.id, NEW.lab_id, (NEW.calibration->>'lowerThreshold')::float8, (NEW.calibration->>'upperThreshold')::float8,
                CASE WHEN NEW.calibration IS NULL THEN NULL ELSE COALESCE(NEW.calibration->>'thresholdEstimator', 'empirical-type7') END)
        ON CONFLICT (library_version_id) DO UPDATE SET t95 = EXCLUDED.t95, t99 = EXCLUDED.t99, threshold_estimator = EXCLUDED.threshold_estimator;
        RETURN NULL;
      END $$`);
    await q.query(`CREATE TRIGGER library_version_tally_insert AFTER INSERT ON library_version FOR EACH ROW EXECUTE FUNCTION library_version_tally_thresholds()`);
    await q.query(`CREATE TRIGGER library_version_tally_update AFTER UPDATE OF calibration ON library_version FOR EACH ROW
                   WHEN (OLD.calibration IS DISTINCT FROM NEW.calibration) EXECUTE FUNCTION library_version_tally_thresholds()`);
    // Lots are written many at a time: statement triggers add up each statement's rows per version.
    await q.query(`
      CREATE FUNCTION reference_lot_tally() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP IN ('INSERT', 'UPDATE') THEN
          UPDATE library_version_tally t SET lots = t.lots + d.n, included_lots = t.included_lots + d.i
          FROM (SELECT library_version_id, count(*)::int AS n, (count(*) FILTER (WHERE included))::int AS i FROM new_rows GROUP BY 1) d
          WHERE t.library_version_id = d.library_version_id;
        END IF;
        IF TG_OP IN ('DELETE', 'UPDATE') THEN
          UPDATE library_version_tally t SET lots = t.lots - d.n, included_lots = t.included_lots - d.i
          FROM (SELECT library_version_id, count(*)::int AS n, (count(*) FILTER (WHERE included))::int AS i FROM old_rows GROUP BY 1) d
          WHERE t.library_version_id = d.library_version_id;
        END IF;
        RETURN NULL;
      END $$`);
    await q.query(`CREATE TRIGGER reference_lot_tally_insert AFTER INSERT ON reference_lot REFERENCING NEW TABLE AS new_rows
                   FOR EACH STATEMENT EXECUTE FUNCTION reference_lot_tally()`);
    await q.query(`CREATE TRIGGER reference_lot_tally_update AFTER UPDATE ON reference_lot REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
                   FOR EACH STATEMENT EXECUTE FUNCTION reference_lot_tally()`);
    await q.query(`CREATE TRIGGER reference_lot_tally_delete AFTER DELETE ON reference_lot REFERENCING OLD TABLE AS old_rows
                   FOR EACH STATEMENT EXECUTE FUNCTION reference_lot_tally()`);
    await q.query(`
      INSERT INTO library_version_tally (library_version_id, lab_id, lots, included_lots, t95, t99, threshold_estimator)
      SELECT v.id, v.lab_id,
             (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id),
             (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id AND r.included),
             (v.calibration->>'lowerThreshold')::float8, (v.calibration->>'upperThreshold')::float8,
             CASE WHEN v.calibration IS NULL THEN NULL ELSE COALESCE(v.calibration->>'thresholdEstimator', 'empirical-type7') END
      FROM library_version v`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER reference_lot_tally_insert ON reference_lot`);
    await q.query(`DROP TRIGGER reference_lot_tally_update ON reference_lot`);
    await q.query(`DROP TRIGGER reference_lot_tally_delete ON reference_lot`);
    await q.query(`DROP FUNCTION reference_lot_tally()`);
    await q.query(`DROP TRIGGER library_version_tally_insert ON library_version`);
    await q.query(`DROP TRIGGER library_version_tally_update ON library_version`);
    await q.query(`DROP FUNCTION library_version_tally_thresholds()`);
    await q.query(`DROP TABLE library_version_tally`);
    for (const name of [
      'sample_age_idx', 'sample_state_age_idx', 'sample_lab_code_idx', 'sample_code_trgm_idx', 'sample_claimed_lot_trgm_idx', 'sample_label_text_trgm_idx',
      'test_order_product_idx', 'test_order_client_page_idx', 'test_report_page_idx', 'test_report_client_page_idx', 'test_report_lab_number_idx',
      'test_report_number_trgm_idx', 'test_report_sample_code_trgm_idx', 'test_report_product_name_trgm_idx', 'analysis_page_idx',
      'analysis_status_page_idx', 'analysis_submitted_page_idx', 'audit_event_page_idx', 'audit_event_action_trgm_idx', 'payment_page_idx',
      'payment_client_page_idx', 'credit_ledger_entry_reason_trgm_idx', 'credit_ledger_entry_sample_idx', 'credit_ledger_entry_page_idx', 'test_order_cancelled_idx',
    ]) {
      await q.query(`DROP INDEX IF EXISTS ${name}`);
    }
    await q.query(`DROP TRIGGER test_order_placed_at ON test_order`);
    await q.query(`DROP FUNCTION test_order_pass_placed_at()`);
    await q.query(`DROP TRIGGER sample_placed_at ON sample`);
    await q.query(`DROP FUNCTION sample_copy_placed_at()`);
    await q.query(`ALTER TABLE sample DROP COLUMN placed_at`);
  }
}
