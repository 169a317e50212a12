import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Rate-limit counters live in PostgreSQL, so every API process behind a load balancer counts the
 * same failed sign-ins and verification checks. Not tenant data: a key is a client address (and,
 * for sign-in, an e-mail address) under the limiter's own prefix.
 */
export class RateLimitWindows1796180800000 implements MigrationInterface {
  name = 'RateLimitWindows1796180800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE rate_limit_window (
        key text PRIMARY KEY,
        hits integer NOT NULL CHECK (hits >= 0),
        resets_at timestamptz NOT NULL
      );
      CREATE INDEX rate_limit_window_resets_idx ON rate_limit_window (resets_at);
    `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE rate_limit_window`);
  }
}
