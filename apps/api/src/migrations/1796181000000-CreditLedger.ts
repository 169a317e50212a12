import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A client organisation's test credits: one account row (available and reserved, never below zero,
 * enforced by CHECK constraints so no code path and no concurrent order can overdraw it) and an
 * append-only ledger with every movement, its reason, what it refers to and who made it.
 */
export class CreditLedger1796181000000 implements MigrationInterface {
  name = 'CreditLedger1796181000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE credit_account (
        client_organisation_id uuid PRIMARY KEY REFERENCES client_organisation(id),
        lab_id uuid NOT NULL REFERENCES lab(id),
        available integer NOT NULL DEFAULT 0 CONSTRAINT credit_account_available_not_negative CHECK (available >= 0),
        reserved integer NOT NULL DEFAULT 0 CONSTRAINT credit_account_reserved_not_negative CHECK (reserved >= 0),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX credit_account_lab_idx ON credit_account (lab_id, client_organisation_id);

      CREATE TABLE credit_ledger_entry (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        entry_no bigint GENERATED ALWAYS AS IDENTITY,
        lab_id uuid NOT NULL REFERENCES lab(id),
        client_organisation_id uuid NOT NULL REFERENCES client_organisation(id),
        kind text NOT NULL CHECK (kind IN ('purchase', 'reserve', 'release', 'consume', 'refund', 'adjustment')),
        available_change integer NOT NULL,
        reserved_change integer NOT NULL,
        available_after integer NOT NULL CHECK (available_after >= 0),
        reserved_after integer NOT NULL CHECK (reserved_after >= 0),
        reason text NOT NULL,
        order_id uuid REFERENCES test_order(id),
        sample_id uuid REFERENCES sample(id),
        payment_id uuid,
        actor_user_id uuid REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        CHECK (available_change <> 0 OR reserved_change <> 0)
      );
      CREATE INDEX credit_ledger_entry_account_idx ON credit_ledger_entry (lab_id, client_organisation_id, entry_no);
      CREATE INDEX credit_ledger_entry_order_idx ON credit_ledger_entry (lab_id, order_id) WHERE order_id IS NOT NULL;
      CREATE INDEX credit_ledger_entry_payment_idx ON credit_ledger_entry (lab_id, payment_id) WHERE payment_id IS NOT NULL;

      CREATE FUNCTION credit_ledger_entry_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'the credit ledger is append-only: % refused on credit_ledger_entry', TG_OP
          USING ERRCODE = 'insufficient_privilege';
      END $$;
      CREATE TRIGGER credit_ledger_entry_append_only BEFORE UPDATE OR DELETE ON credit_ledger_entry
        FOR EACH ROW EXECUTE FUNCTION credit_ledger_entry_refuse_change();
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE credit_ledger_entry;
      DROP FUNCTION credit_ledger_entry_refuse_change();
      DROP TABLE credit_account;
    `);
  }
}
