import type { EntityManager } from 'typeorm';
import { EmailOutbox } from './email-outbox.entity';

export interface OutgoingEmail {
  labId: string | null;
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Reply-To header; the lab's contact e-mail for anything a client may answer. */
  replyTo?: string | null;
}

/**
 * Queues a message in the caller's transaction: it is sent only if the change that caused it
 * commits, and a mail-server outage delays it instead of losing it. Returns the outbox id.
 */
export async function enqueueEmail(manager: EntityManager, email: OutgoingEmail): Promise<string> {
  const result = await manager.insert(EmailOutbox, {
    labId: email.labId,
    to: email.to,
    subject: email.subject,
    text: email.text,
    html: email.html ?? null,
    replyTo: email.replyTo || null,
  });
  return result.identifiers[0].id as string;
}
