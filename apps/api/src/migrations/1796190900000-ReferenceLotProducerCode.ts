import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A library lot keeps the producer's own lot code (from its reference-lot declaration) beside the
 * lab's code, so a reviewer can compare the nearest lot with the lot a client claimed. Lots built
 * from enrolled samples take it from the sample's declaration; earlier lots without one keep null.
 */
export class ReferenceLotProducerCode1796190900000 implements MigrationInterface {
  name = 'ReferenceLotProducerCode1796190900000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE reference_lot ADD COLUMN producer_lot_code text NULL CHECK (length(producer_lot_code) <= 100)`);
    await q.query(`
      UPDATE reference_lot r SET producer_lot_code = s.reference_lot->>'lotCode'
      FROM sample s WHERE s.id = r.sample_id AND s.reference_lot ? 'lotCode'`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE reference_lot DROP COLUMN producer_lot_code`);
  }
}
