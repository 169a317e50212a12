import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Results that stay small at any library size: a published version's reference band stored once
 * beside it (older published versions get theirs the first time they are read), and every lot's
 * distance of an analysis kept apart from its result as packed float64, read page by page.
 */
export class SlimAnalysisResults1796190000000 implements MigrationInterface {
  name = 'SlimAnalysisResults1796190000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE library_version_band (
        library_version_id uuid PRIMARY KEY REFERENCES library_version(id) ON DELETE CASCADE,
        lab_id uuid NOT NULL REFERENCES lab(id),
        band jsonb NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX library_version_band_lab_idx ON library_version_band (lab_id, library_version_id);

      CREATE TABLE analysis_lot_distance (
        analysis_id uuid PRIMARY KEY REFERENCES analysis(id) ON DELETE CASCADE,
        lab_id uuid NOT NULL REFERENCES lab(id),
        lot_count integer NOT NULL CHECK (lot_count >= 0),
        -- nearest first: per lot a little-endian uint32 lot index (the version's lot order) and float64 distance
        ranked bytea NOT NULL CHECK (octet_length(ranked) = 12 * lot_count)
      );
      CREATE INDEX analysis_lot_distance_lab_idx ON analysis_lot_distance (lab_id, analysis_id);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE analysis_lot_distance; DROP TABLE library_version_band`);
  }
}
