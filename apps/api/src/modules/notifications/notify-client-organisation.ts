import type { EntityManager } from 'typeorm';
import type { NotificationEvent } from '@ohmprint/contracts';
import { ClientNotificationRow } from './client-notification.entity';
import { composeLabEmail, labSender } from './lab-email';
import { enqueueEmail } from '../mail/enqueue-email';

/** Events told to a whole organisation (an invitation goes to one address: `enqueueLabEmail`). */
export type OrganisationEvent = Exclude<NotificationEvent, 'invitation'>;

/**
 * Who hears of what: money and orders are the client admins' business (they order and pay);
 * reports concern everyone in the organisation, members included.
 */
export const AUDIENCE: Record<OrganisationEvent, 'admins' | 'everyone'> = {
  'order-placed': 'admins',
  'payment-received': 'admins',
  'sample-received': 'admins',
  'sample-rejected': 'admins',
  'report-issued': 'everyone',
  'report-amended': 'everyone',
  'report-revoked': 'everyone',
};

export interface OrganisationNotice {
  labId: string;
  clientOrganisationId: string;
  event: OrganisationEvent;
  subject: string;
  /** Plain text, paragraphs separated by a blank line; also the in-app notification's body. */
  text: string;
  /** The e-mail body as HTML (no wrapper); made from `text` when absent. */
  html?: string;
  /** A client-portal path such as `/orders/<id>` or `/reports`; null when there is nothing to open. */
  link?: string | null;
  /** In-app rows only, no e-mail: for an event whose e-mail the caller sends itself (a receipt to the payer). */
  inAppOnly?: boolean;
}

export interface NotifiedRecipients {
  /** Addresses an e-mail was queued to (the users, plus the organisation's contact address). */
  emailed: string[];
  /** Users who got an in-app notification. */
  userIds: string[];
}

/**
 * Tells a client organisation about an event, in the caller's transaction: one e-mail (HTML and
 * plain text, the lab's name and contact, Reply-To the lab's contact e-mail) to each recipient and
 * one in-app notification per recipient user. Recipients are the organisation's active users chosen
 * by `AUDIENCE`; the organisation's contact address also gets the e-mail. Nothing goes to another
 * organisation or lab: every query is scoped by both ids.
 */
export async function notifyClientOrganisation(manager: EntityManager, notice: OrganisationNotice): Promise<NotifiedRecipients> {
  const { labId, clientOrganisationId } = notice;
  const roles = AUDIENCE[notice.event] === 'admins' ? ['client-admin'] : ['client-admin', 'client-member'];
  const users: Array<{ id: string; email: string }> = await manager.query(
    `SELECT u.id, u.email FROM client_membership m
       JOIN client_organisation o ON o.id = m.client_organisation_id AND o.lab_id = m.lab_id
       JOIN app_user u ON u.id = m.user_id AND u.status = 'active'
      WHERE m.lab_id = $1 AND m.client_organisation_id = $2 AND m.role = ANY($3::text[])
      ORDER BY u.email`,
    [labId, clientOrganisationId, roles],
  );
  const [organisation]: Array<{ contact_email: string | null }> = await manager.query(
    'SELECT contact_email FROM client_organisation WHERE lab_id = $1 AND id = $2',
    [labId, clientOrganisationId],
  );
  if (!organisation) return { emailed: [], userIds: [] };
  const addresses = [...new Set([...users.map((u) => u.email), organisation.contact_email].filter((e): e is string => !!e).map((e) => e.trim()))].sort();

  const lab = await labSender(manager, labId);
  const mail = composeLabEmail(lab, { subject: notice.subject, text: notice.text, html: notice.html, link: notice.link ?? null });
  for (const to of notice.inAppOnly ? [] : addresses) {
    await enqueueEmail(manager, { labId, to, subject: mail.subject, text: mail.text, html: mail.html, replyTo: lab.contactEmail || null });
  }
  if (users.length) {
    await manager.insert(
      ClientNotificationRow,
      users.map((u) => ({ labId, clientOrganisationId, userId: u.id, event: notice.event, subject: notice.subject, body: notice.text.trim(), link: notice.link ?? null, readAt: null })),
    );
  }
  return { emailed: notice.inAppOnly ? [] : addresses, userIds: users.map((u) => u.id) };
}
