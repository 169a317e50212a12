import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A client's notifications list reads a deep page by skipping index entries only: the index in
 * the list's order now carries the organisation and the read time (both tested by the list), so
 * the skipped rows are never visited in the table.
 */
export class NotificationPageIndex1796191400100 implements MigrationInterface {
  name = 'NotificationPageIndex1796191400100';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX client_notification_page_idx ON client_notification (lab_id, user_id, created_at DESC, entry_no DESC) INCLUDE (client_organisation_id, read_at, id)`);
    await q.query(`DROP INDEX client_notification_user_idx`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX client_notification_user_idx ON client_notification (lab_id, user_id, created_at DESC, entry_no DESC)`);
    await q.query(`DROP INDEX client_notification_page_idx`);
  }
}
