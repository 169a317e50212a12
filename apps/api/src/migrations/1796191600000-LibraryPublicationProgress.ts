import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * How far a library version's publication job is, written by the worker while it runs (outside
 * the job's own transaction, so the library screen can read it): the calibration's lots compared
 * so far and the stage. One row per version, cleared when publication is asked for again. No
 * foreign key on purpose: the job's transaction holds the version row FOR UPDATE, and a key check
 * would make every progress write wait for that very transaction.
 */
export class LibraryPublicationProgress1796191600000 implements MigrationInterface {
  name = 'LibraryPublicationProgress1796191600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE library_publication_progress (
        library_version_id uuid PRIMARY KEY,
        lab_id uuid NOT NULL,
        stage text NOT NULL CHECK (stage IN ('comparing-lots', 'estimating-thresholds', 'storing')),
        lots_done integer NOT NULL CHECK (lots_done >= 0),
        lot_count integer NOT NULL CHECK (lot_count >= 0),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE library_publication_progress`);
  }
}
