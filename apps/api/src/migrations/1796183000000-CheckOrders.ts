import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * What a producer's orders need: any other liquid as a product matrix and a label photo per
 * product; an order's kind (checks or reference enrolment), its shipment (carrier, tracking number)
 * and a status for an order closed without any report; each sample's own credits (how many, and
 * whether they are held, returned or spent), container and photo; the lab's shipping address.
 */
export class CheckOrders1796183000000 implements MigrationInterface {
  name = 'CheckOrders1796183000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE product DROP CONSTRAINT IF EXISTS product_matrix_check;
      ALTER TABLE product ADD CONSTRAINT product_matrix_check
        CHECK (matrix IN ('wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine', 'other-liquid'));
      ALTER TABLE product ADD COLUMN updated_at timestamptz NOT NULL DEFAULT now();

      CREATE TABLE product_photo (
        product_id uuid PRIMARY KEY REFERENCES product(id),
        lab_id uuid NOT NULL REFERENCES lab(id),
        file_name text NOT NULL,
        content_type text NOT NULL CHECK (content_type IN ('image/png', 'image/jpeg')),
        size_bytes integer NOT NULL CHECK (size_bytes > 0),
        content bytea NOT NULL,
        uploaded_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX product_photo_lab_idx ON product_photo (lab_id, product_id);

      ALTER TABLE test_order DROP CONSTRAINT IF EXISTS test_order_status_check;
      ALTER TABLE test_order ADD CONSTRAINT test_order_status_check
        CHECK (status IN ('placed', 'in-progress', 'completed', 'closed', 'cancelled'));
      ALTER TABLE test_order
        ADD COLUMN kind text NOT NULL DEFAULT 'check' CHECK (kind IN ('check', 'reference-enrolment')),
        ADD COLUMN carrier text NOT NULL DEFAULT '',
        ADD COLUMN tracking_number text NOT NULL DEFAULT '',
        ADD COLUMN shipped_at timestamptz,
        ADD COLUMN cancelled_at timestamptz;

      ALTER TABLE sample
        ADD COLUMN credits integer NOT NULL DEFAULT 0 CHECK (credits >= 0),
        ADD COLUMN credit_state text NOT NULL DEFAULT 'none' CHECK (credit_state IN ('none', 'reserved', 'released', 'consumed')),
        ADD COLUMN container text NOT NULL DEFAULT '',
        ADD COLUMN client_notes text NOT NULL DEFAULT '';

      CREATE TABLE sample_client_photo (
        sample_id uuid PRIMARY KEY REFERENCES sample(id),
        lab_id uuid NOT NULL REFERENCES lab(id),
        file_name text NOT NULL,
        content_type text NOT NULL CHECK (content_type IN ('image/png', 'image/jpeg')),
        size_bytes integer NOT NULL CHECK (size_bytes > 0),
        content bytea NOT NULL,
        uploaded_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX sample_client_photo_lab_idx ON sample_client_photo (lab_id, sample_id);

      ALTER TABLE lab ADD COLUMN IF NOT EXISTS shipping_address text NOT NULL DEFAULT '';
      ALTER TABLE lab ADD COLUMN IF NOT EXISTS shipping_instructions text NOT NULL DEFAULT '';
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE sample_client_photo;
      ALTER TABLE sample DROP COLUMN client_notes, DROP COLUMN container, DROP COLUMN credit_state, DROP COLUMN credits;
      ALTER TABLE test_order DROP COLUMN cancelled_at, DROP COLUMN shipped_at, DROP COLUMN tracking_number,
        DROP COLUMN carrier, DROP COLUMN kind;
      ALTER TABLE test_order DROP CONSTRAINT test_order_status_check;
      ALTER TABLE test_order ADD CONSTRAINT test_order_status_check CHECK (status IN ('placed', 'in-progress', 'completed', 'cancelled'));
      DROP TABLE product_photo;
      ALTER TABLE product DROP COLUMN updated_at;
      ALTER TABLE product DROP CONSTRAINT product_matrix_check;
      ALTER TABLE product ADD CONSTRAINT product_matrix_check CHECK (matrix IN ('wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine'));
    `);
  }
}
