import type { Transporter } from 'nodemailer';
import type { DataSource } from 'typeorm';
import { config } from '../../config';
import { logger } from '../../core/logger';
import { EmailOutbox } from './email-outbox.entity';

const BATCH_SIZE = 20;
const FIRST_RETRY_SECONDS = 15;
const LONGEST_RETRY_SECONDS = 3600;

/** Exponential backoff: 15 s, 30 s, 1 min, … capped at an hour. */
export function retryDelaySeconds(attempts: number): number {
  return Math.min(FIRST_RETRY_SECONDS * 2 ** Math.max(0, attempts - 1), LONGEST_RETRY_SECONDS);
}

export interface DeliveryRound {
  sent: number;
  failed: number;
}

/** How long a claimed message is left alone while one process sends it (then it is due again). */
const SEND_LEASE_SECONDS = 120;

/**
 * The Message-ID of an outbox row: the same on every attempt, so a message sent again after a
 * crash between sending and recording it is recognisable as the same message.
 */
export function outboxMessageId(outboxId: string, from = config.mail.from): string {
  const domain = /@([A-Za-z0-9.-]+)>?\s*$/.exec(from)?.[1] ?? 'ohmprint.invalid';
  return `<outbox-${outboxId}@${domain}>`;
}

/**
 * Claims one due message (the oldest, or the one named) in its own short transaction: its attempt
 * is counted and leased, so no other process sends it meanwhile.
 */
async function claimNext(dataSource: DataSource, outboxId?: string): Promise<EmailOutbox | null> {
  return dataSource.transaction(async (manager) => {
    const query = manager
      .createQueryBuilder(EmailOutbox, 'm')
      .where("m.status = 'pending' AND m.next_attempt_at <= now()");
    if (outboxId) query.andWhere('m.id = :outboxId', { outboxId });
    const message = await query
      .orderBy('m.next_attempt_at', 'ASC')
      .limit(1)
      .setLock('pessimistic_write')
      .setOnLocked('skip_locked')
      .getOne();
    if (!message) return null;
    message.attempts += 1;
    await manager.update(EmailOutbox, message.id, { attempts: message.attempts, nextAttemptAt: new Date(Date.now() + SEND_LEASE_SECONDS * 1000) });
    return message;
  });
}

/** Sends one claimed message and commits its outcome at once (sent, or failed with the next attempt's time). */
async function sendClaimed(dataSource: DataSource, transport: Transporter, message: EmailOutbox, from: string): Promise<'sent' | 'failed'> {
  const attempts = message.attempts;
  try {
    const messageId = outboxMessageId(message.id, from);
    await transport.sendMail({ from, to: message.to, subject: message.subject, text: message.text, html: message.html ?? undefined, replyTo: message.replyTo ?? undefined, messageId });
    await dataSource.manager.update(EmailOutbox, message.id, { status: 'sent', sentAt: new Date(), lastError: null, messageId });
    return 'sent';
  } catch (err) {
    const giveUp = attempts >= config.mail.maxAttempts;
    await dataSource.manager.update(EmailOutbox, message.id, {
      status: giveUp ? 'failed' : 'pending',
      lastError: String((err as Error)?.message ?? err).slice(0, 2000),
      nextAttemptAt: new Date(Date.now() + retryDelaySeconds(attempts) * 1000),
    });
    logger.warn({ outboxId: message.id, attempts, giveUp, err: (err as Error)?.message }, 'e-mail delivery failed');
    return 'failed';
  }
}

/**
 * The `email-send` job: sends one queued message if it is still pending and due. A message already
 * sent, or being sent by another worker, is left alone, so two workers never send it twice; a
 * failed attempt is rescheduled in the outbox and picked up by the sweep (`deliverDueEmails`).
 */
export async function deliverOutboxMessage(dataSource: DataSource, transport: Transporter, outboxId: string, from = config.mail.from): Promise<'sent' | 'failed' | 'not-due'> {
  const message = await claimNext(dataSource, outboxId);
  if (!message) return 'not-due';
  return sendClaimed(dataSource, transport, message, from);
}

/**
 * Sends the messages that are due, each on its own: a message is claimed (attempt counted, leased
 * for two minutes) and committed, sent, and its outcome committed at once, so an outage or crash
 * mid-round never sends again a message already recorded as sent. Rows are claimed with FOR UPDATE
 * SKIP LOCKED, so several processes can run this side by side. Every attempt carries the same
 * Message-ID.
 */
export async function deliverDueEmails(dataSource: DataSource, transport: Transporter, from = config.mail.from): Promise<DeliveryRound> {
  const round: DeliveryRound = { sent: 0, failed: 0 };
  for (let i = 0; i < BATCH_SIZE; i++) {
    const message = await claimNext(dataSource);
    if (!message) break;
    if ((await sendClaimed(dataSource, transport, message, from)) === 'sent') round.sent += 1;
    else round.failed += 1;
  }
  return round;
}

/** Polls the outbox until stopped; `stop()` resolves once the current round has finished. */
export function startOutboxWorker(dataSource: DataSource, transport: Transporter, pollMs = config.mail.pollMs): { stop(): Promise<void> } {
  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  let current: Promise<unknown> = Promise.resolve();
  const tick = (): void => {
    current = deliverDueEmails(dataSource, transport)
      .catch((err) => logger.error({ err }, 'e-mail outbox round failed'))
      .finally(() => {
        if (!stopped) timer = setTimeout(tick, pollMs);
      });
  };
  timer = setTimeout(tick, 0);
  return {
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await current;
    },
  };
}
