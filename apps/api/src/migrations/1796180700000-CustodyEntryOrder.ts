import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Custody events written in one transaction (accepted, then stored) share their occurred and
 * recorded times, because now() is fixed for a transaction. An identity column keeps the order
 * in which they were appended, so the timeline never swaps them. Existing rows are numbered in
 * table order, which for an append-only table is the order they were written.
 */
export class CustodyEntryOrder1796180700000 implements MigrationInterface {
  name = 'CustodyEntryOrder1796180700000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE custody_event ADD COLUMN entry_no bigint GENERATED ALWAYS AS IDENTITY`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE custody_event DROP COLUMN entry_no`);
  }
}
