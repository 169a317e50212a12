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

/** Claims one due message in its own short transaction: its attempt is counted and leased. */
async function claimNext(dataSource: DataSource): Promise<EmailOutbox | null> {
  return dataSource.transaction(async (manager) => {
    const message = await manager
      .createQueryBuilder(EmailOutbox, 'm')
      .where("m.status = 'pending' AND m.next_attempt_at <= now()")
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
    const attempts = message.attempts;
    try {
      const messageId = outboxMessageId(message.id, from);
      await transport.sendMail({ from, to: message.to, subject: message.subject, text: message.text, html: message.html ?? undefined, replyTo: message.replyTo ?? undefined, messageId });
      await dataSource.manager.update(EmailOutbox, message.id, { status: 'sent', sentAt: new Date(), lastError: null, messageId });
      round.sent += 1;
    } catch (err) {
      const giveUp = attempts >= config.mail.maxAttempts;
      await dataSource.manager.update(EmailOutbox, message.id, {
        status: giveUp ? 'failed' : 'pending',
        lastError: String((err as Error)?.message ?? err).slice(0, 2000),
        nextAttemptAt: new Date(Date.now() + retryDelaySeconds(attempts) * 1000),
      });
      round.failed += 1;
      logger.warn({ outboxId: message.id, attempts, giveUp, err: (err as Error)?.message }, 'e-mail delivery failed');
    }
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
