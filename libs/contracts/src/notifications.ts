import { z } from 'zod';
import { listQuery, pageOf } from './paging';

/** What a client organisation is told about, by e-mail and in the client portal. */
export const NOTIFICATION_EVENTS = [
  'invitation',
  'order-placed',
  'payment-received',
  'sample-received',
  'sample-rejected',
  'report-issued',
  'report-amended',
  'report-revoked',
] as const;
export const NotificationEventSchema = z.enum(NOTIFICATION_EVENTS);
export type NotificationEvent = z.infer<typeof NotificationEventSchema>;

/** How each event reads in a list. */
export const NOTIFICATION_EVENT_LABELS: Record<NotificationEvent, string> = {
  invitation: 'Invitation',
  'order-placed': 'Order placed',
  'payment-received': 'Payment received',
  'sample-received': 'Sample received',
  'sample-rejected': 'Sample not accepted',
  'report-issued': 'Report issued',
  'report-amended': 'Report amended',
  'report-revoked': 'Report revoked',
};

export const ClientNotificationSchema = z.object({
  id: z.uuid(),
  event: NotificationEventSchema,
  subject: z.string(),
  body: z.string(),
  /** A client-portal path (e.g. `/reports`, `/orders/…`), or null when there is nothing to open. */
  link: z.string().nullable(),
  readAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
});
export type ClientNotification = z.infer<typeof ClientNotificationSchema>;

export const ClientNotificationListQuerySchema = listQuery(['createdAt'], 'desc').extend({
  unread: z.enum(['true', 'false']).optional(),
});
export type ClientNotificationListQuery = z.infer<typeof ClientNotificationListQuerySchema>;
export const ClientNotificationPageSchema = pageOf(ClientNotificationSchema);
export type ClientNotificationPage = z.infer<typeof ClientNotificationPageSchema>;

export const UnreadCountSchema = z.object({ unread: z.number().int().min(0) });
export type UnreadCount = z.infer<typeof UnreadCountSchema>;
export const MarkedReadSchema = z.object({ marked: z.number().int().min(0) });
