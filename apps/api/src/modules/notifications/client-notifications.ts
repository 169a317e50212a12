import type { EntityManager } from 'typeorm';
import type { ClientNotification, ClientNotificationListQuery, ClientNotificationPage } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

/** Whose notifications: one user of one organisation of one lab (all from the caller's session). */
export interface NotificationReader {
  labId: string;
  clientOrganisationId: string;
  userId: string;
}

interface Row {
  id: string;
  event: ClientNotification['event'];
  subject: string;
  body: string;
  link: string | null;
  read_at: Date | null;
  created_at: Date;
}

const SCOPE = 'lab_id = $1 AND client_organisation_id = $2 AND user_id = $3';
const scopeValues = (r: NotificationReader): string[] => [r.labId, r.clientOrganisationId, r.userId];

function toView(row: Row): ClientNotification {
  return {
    id: row.id,
    event: row.event,
    subject: row.subject,
    body: row.body,
    link: row.link,
    readAt: row.read_at ? row.read_at.toISOString() : null,
    createdAt: row.created_at.toISOString(),
  };
}

/** Newest first (ties broken by insertion order); `unread=true` for the unread ones only. */
export async function listNotifications(manager: EntityManager, reader: NotificationReader, query: ClientNotificationListQuery): Promise<ClientNotificationPage> {
  const { skip, take } = pageParams(query);
  const unread = query.unread === 'true' ? ' AND read_at IS NULL' : query.unread === 'false' ? ' AND read_at IS NOT NULL' : '';
  const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
  // the page's ids come from the list's covering index alone (a deep page skips index entries),
  // then only those rows are read
  const [rows, counted] = await Promise.all([
    manager.query(
      `SELECT n.id, n.event, n.subject, n.body, n.link, n.read_at, n.created_at
       FROM client_notification n JOIN (SELECT id FROM client_notification WHERE ${SCOPE}${unread}
                                        ORDER BY created_at ${dir}, entry_no ${dir} OFFSET $4 LIMIT $5) page USING (id)
       ORDER BY n.created_at ${dir}, n.entry_no ${dir}`,
      [...scopeValues(reader), skip, take],
    ) as Promise<Row[]>,
    cappedCount(manager, `FROM client_notification WHERE ${SCOPE}${unread}`, scopeValues(reader), totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(toView), counted, query);
}

export async function unreadCount(manager: EntityManager, reader: NotificationReader): Promise<number> {
  const [{ unread }] = await manager.query(`SELECT count(*)::int AS unread FROM client_notification WHERE ${SCOPE} AND read_at IS NULL`, scopeValues(reader));
  return unread;
}

/** Marks one of the reader's own notifications read (already read: unchanged); anyone else's is 404. */
export async function markRead(manager: EntityManager, reader: NotificationReader, id: string): Promise<ClientNotification> {
  // TypeORM answers an UPDATE with [rows, rowCount]
  const [rows]: [Row[], number] = await manager.query(
    `UPDATE client_notification SET read_at = coalesce(read_at, now()) WHERE ${SCOPE} AND id = $4
     RETURNING id, event, subject, body, link, read_at, created_at`,
    [...scopeValues(reader), id],
  );
  const row = rows[0];
  if (!row) throw ApiError.notFound('Notification');
  return toView(row);
}

export async function markAllRead(manager: EntityManager, reader: NotificationReader): Promise<number> {
  const result = await manager.query(`UPDATE client_notification SET read_at = now() WHERE ${SCOPE} AND read_at IS NULL`, scopeValues(reader));
  return (result as [unknown[], number])[1] ?? 0;
}
