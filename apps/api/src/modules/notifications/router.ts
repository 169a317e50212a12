import type { Response, Router } from 'express';
import {
  ClientNotificationListQuerySchema,
  ClientNotificationPageSchema,
  ClientNotificationSchema,
  IdParamsSchema,
  MarkedReadSchema,
  UnreadCountSchema,
  type ClientNotificationListQuery,
  type Role,
} from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { clientOrganisationIdOf, labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { listNotifications, markAllRead, markRead, unreadCount, type NotificationReader } from './client-notifications';

const tag = 'Client notifications';
const CLIENTS: Role[] = ['client-admin', 'client-member'];
const readerOf = (res: Response): NotificationReader => ({
  labId: labIdOf(res.locals.auth),
  clientOrganisationId: clientOrganisationIdOf(res.locals.auth),
  userId: res.locals.auth.userId,
});

/** The signed-in client user's own notifications; anyone else's answer 404. */
export function clientNotificationsRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/client/notifications', tag, summary: 'My notifications, newest first (`unread=true` for unread only)',
    roles: CLIENTS, query: ClientNotificationListQuerySchema, response: ClientNotificationPageSchema }, async (_req, res) => {
    res.json(await listNotifications(dataSource.manager, readerOf(res), res.locals.query as ClientNotificationListQuery));
  });

  route({ method: 'get', path: '/client/notifications/unread-count', tag, summary: 'How many of my notifications are unread',
    roles: CLIENTS, response: UnreadCountSchema }, async (_req, res) => {
    res.json({ unread: await unreadCount(dataSource.manager, readerOf(res)) });
  });

  route({ method: 'post', path: '/client/notifications/read-all', tag, summary: 'Mark all my notifications read',
    roles: CLIENTS, response: MarkedReadSchema }, async (_req, res) => {
    res.json({ marked: await markAllRead(dataSource.manager, readerOf(res)) });
  });

  route({ method: 'post', path: '/client/notifications/:id/read', tag, summary: 'Mark one of my notifications read',
    roles: CLIENTS, params: IdParamsSchema, response: ClientNotificationSchema }, async (_req, res) => {
    res.json(await markRead(dataSource.manager, readerOf(res), (res.locals.params as { id: string }).id));
  });

  return router;
}
