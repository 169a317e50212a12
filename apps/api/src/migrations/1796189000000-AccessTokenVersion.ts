import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A per-user token version: a password change or reset moves it on and ends older access tokens. */
export class AccessTokenVersion1796189000000 implements MigrationInterface {
  name = 'AccessTokenVersion1796189000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE app_user ADD COLUMN token_version integer NOT NULL DEFAULT 0`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE app_user DROP COLUMN token_version`);
  }
}
