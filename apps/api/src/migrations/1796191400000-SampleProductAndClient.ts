import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The work queue's search tests each sample's product and client organisation. They belong to the
 * sample's order, so a search joined every sample to its order (in practice: hashed every order
 * of the lab per request). Both are now copied onto the sample by the trigger that already copies
 * the order's placement time, so a search tests the sample row alone; an order's product and
 * client do not change, but if they did the order's trigger passes the change on.
 */
export class SampleProductAndClient1796191400000 implements MigrationInterface {
  name = 'SampleProductAndClient1796191400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE sample ADD COLUMN product_id uuid, ADD COLUMN client_organisation_id uuid`);
    await q.query(`UPDATE sample s SET product_id = o.product_id, client_organisation_id = o.client_organisation_id FROM test_order o WHERE o.id = s.order_id`);
    await q.query(`ALTER TABLE sample ALTER COLUMN product_id SET NOT NULL, ALTER COLUMN client_organisation_id SET NOT NULL`);
    await q.query(`
      CREATE OR REPLACE FUNCTION sample_copy_placed_at() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        SELECT o.placed_at, o.product_id, o.client_organisation_id INTO NEW.placed_at, NEW.product_id, NEW.client_organisation_id
        FROM test_order o WHERE o.id = NEW.order_id;
        RETURN NEW;
      END $$`);
    await q.query(`
      CREATE FUNCTION test_order_pass_product_and_client() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        UPDATE sample SET product_id = NEW.product_id, client_organisation_id = NEW.client_organisation_id WHERE order_id = NEW.id AND lab_id = NEW.lab_id;
        RETURN NULL;
      END $$`);
    await q.query(`CREATE TRIGGER test_order_product_and_client AFTER UPDATE OF product_id, client_organisation_id ON test_order FOR EACH ROW
                   WHEN (OLD.product_id IS DISTINCT FROM NEW.product_id OR OLD.client_organisation_id IS DISTINCT FROM NEW.client_organisation_id)
                   EXECUTE FUNCTION test_order_pass_product_and_client()`);
    await q.query(`CREATE INDEX sample_product_idx ON sample (lab_id, product_id)`);
    await q.query(`CREATE INDEX sample_client_idx ON sample (lab_id, client_organisation_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX sample_client_idx`);
    await q.query(`DROP INDEX sample_product_idx`);
    await q.query(`DROP TRIGGER test_order_product_and_client ON test_order`);
    await q.query(`DROP FUNCTION test_order_pass_product_and_client()`);
    await q.query(`
      CREATE OR REPLACE FUNCTION sample_copy_placed_at() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        SELECT o.placed_at INTO NEW.placed_at FROM test_order o WHERE o.id = NEW.order_id;
        RETURN NEW;
      END $$`);
    await q.query(`ALTER TABLE sample DROP COLUMN product_id, DROP COLUMN client_organisation_id`);
  }
}
