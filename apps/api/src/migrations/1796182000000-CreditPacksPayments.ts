import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Buying credits: a lab's credit packs (each mapped to a payment-service product and price), each
 * client organisation's payment-service customer, payments (one per checkout, unique by checkout
 * id) and the webhook events already handled (unique by event id). A payment adds credits at most
 * once: a unique index allows one purchase ledger entry per payment.
 */
export class CreditPacksPayments1796182000000 implements MigrationInterface {
  name = 'CreditPacksPayments1796182000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE credit_pack (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        lab_id uuid NOT NULL REFERENCES lab(id),
        name text NOT NULL CHECK (length(name) BETWEEN 1 AND 80),
        credits integer NOT NULL CHECK (credits > 0),
        price_minor bigint NOT NULL CHECK (price_minor >= 0),
        currency text NOT NULL CHECK (currency ~ '^[a-z]{3}$'),
        active boolean NOT NULL DEFAULT true,
        payment_product_id text,
        payment_price_id text,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX credit_pack_lab_idx ON credit_pack (lab_id, active, credits);

      CREATE TABLE payment_customer (
        client_organisation_id uuid PRIMARY KEY REFERENCES client_organisation(id),
        lab_id uuid NOT NULL REFERENCES lab(id),
        customer_id text UNIQUE,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX payment_customer_lab_idx ON payment_customer (lab_id, client_organisation_id);

      CREATE SEQUENCE payment_receipt_seq;
      CREATE TABLE payment (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        receipt_no bigint NOT NULL DEFAULT nextval('payment_receipt_seq') UNIQUE,
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        credit_pack_id uuid NOT NULL REFERENCES credit_pack(id),
        pack_name text NOT NULL,
        credits integer NOT NULL CHECK (credits > 0),
        amount_minor bigint NOT NULL CHECK (amount_minor >= 0),
        currency text NOT NULL,
        price_id text NOT NULL,
        checkout_session_id text NOT NULL CONSTRAINT payment_checkout_session_unique UNIQUE,
        payment_intent_id text,
        status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'paid', 'declined', 'expired', 'refunded')),
        failure_message text,
        started_by_user_id uuid REFERENCES app_user(id),
        paid_at timestamptz,
        refunded_at timestamptz,
        refunded_by_user_id uuid REFERENCES app_user(id),
        refund_id text,
        is_demo boolean NOT NULL DEFAULT false,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX payment_account_idx ON payment (lab_id, client_organisation_id, created_at DESC);
      CREATE INDEX payment_lab_idx ON payment (lab_id, created_at DESC);

      CREATE TABLE payment_webhook_event (
        event_id text PRIMARY KEY,
        type text NOT NULL,
        checkout_session_id text,
        outcome text NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX payment_webhook_event_session_idx ON payment_webhook_event (checkout_session_id) WHERE checkout_session_id IS NOT NULL;

      CREATE UNIQUE INDEX credit_ledger_entry_one_purchase_per_payment ON credit_ledger_entry (payment_id) WHERE kind = 'purchase';
      CREATE UNIQUE INDEX credit_ledger_entry_one_refund_per_payment ON credit_ledger_entry (payment_id) WHERE kind = 'refund';
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP INDEX credit_ledger_entry_one_refund_per_payment;
      DROP INDEX credit_ledger_entry_one_purchase_per_payment;
      DROP TABLE payment_webhook_event;
      DROP TABLE payment;
      DROP SEQUENCE payment_receipt_seq;
      DROP TABLE payment_customer;
      DROP TABLE credit_pack;
    `);
  }
}
