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

/**
 * Sends the messages that are due. Rows are claimed with FOR UPDATE SKIP LOCKED, so several API
 * processes can run this side by side without sending a message twice.
 */
export async function deliverDueEmails(dataSource: DataSource, transport: Transporter, from = config.mail.from): Promise<DeliveryRound> {
  const round: DeliveryRound = { sent: 0, failed: 0 };
  await dataSource.transaction(async (manager) => {
    const due = await manager
      .createQueryBuilder(EmailOutbox, 'm')
      .where("m.status = 'pending' AND m.next_attempt_at <= now()")
      .orderBy('m.next_attempt_at', 'ASC')
      .limit(BATCH_SIZE)
      .setLock('pessimistic_write')
      .setOnLocked('skip_locked')
      .getMany();
    for (const message of due) {
      const attempts = message.attempts + 1;
      try {
        const info = await transport.sendMail({ from, to: message.to, subject: message.subject, text: message.text, html: message.html ?? undefined, replyTo: message.replyTo ?? undefined });
        await manager.update(EmailOutbox, message.id, { status: 'sent', attempts, sentAt: new Date(), lastError: null, messageId: info.messageId ?? null });
        round.sent += 1;
      } catch (err) {
        const giveUp = attempts >= config.mail.maxAttempts;
        await manager.update(EmailOutbox, message.id, {
          status: giveUp ? 'failed' : 'pending',
          attempts,
          lastError: String((err as Error)?.message ?? err).slice(0, 2000),
          nextAttemptAt: new Date(Date.now() + retryDelaySeconds(attempts) * 1000),
        });
        round.failed += 1;
        logger.warn({ outboxId: message.id, attempts, giveUp, err: (err as Error)?.message }, 'e-mail delivery failed');
      }
    }
  });
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
