import type { EntityManager } from 'typeorm';
import { enqueue, jobsStarted } from '../../core/jobs/jobs';
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
 * commits, and a mail-server outage delays it instead of losing it. An `email-send` job for it
 * commits with it, so a worker sends it at once; the worker's outbox sweep sends anything a job
 * did not (a retry after an outage, a message queued by a script that runs no job system).
 * Returns the outbox id.
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
  const id = result.identifiers[0].id as string;
  if (jobsStarted()) await enqueue(manager, 'email-send', { outboxId: id });
  return id;
}
