import { randomUUID } from 'node:crypto';
import type { Transporter } from 'nodemailer';
import { useTestApp } from '../../testing';
import { withMaintenanceConnection } from '../../testing/maintenance-db';
import { enqueueEmail } from './enqueue-email';
import { EmailOutbox } from './email-outbox.entity';
import { deliverDueEmails, outboxMessageId } from './outbox-worker';

const t = useTestApp();

interface Sent {
  to: string;
  messageId: string;
}

/** Records what would be sent; `onSend` runs after each "delivery" (e.g. to cut the database off). */
function recordingTransport(sent: Sent[], onSend?: (count: number) => Promise<void>): Transporter {
  return {
    async sendMail(mail: { to: string; messageId: string }) {
      sent.push({ to: mail.to, messageId: mail.messageId });
      await onSend?.(sent.length);
      return { messageId: mail.messageId };
    },
  } as unknown as Transporter;
}

/** What a PostgreSQL restart does to the API's connections: every one of them is cut. */
async function cutDatabaseConnections(): Promise<void> {
  await withMaintenanceConnection((c) => c.query('SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()', [t.databaseName]));
}

describe('e-mail outbox, one message at a time', () => {
  it('never sends again a message already sent when the database goes away mid-round, and keeps one Message-ID per message', async () => {
    await t.db.manager.update(EmailOutbox, { status: 'pending' }, { status: 'sent' });
    const batch = `batch-${randomUUID()}`;
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) {
      ids.push(await t.db.transaction((m) => enqueueEmail(m, { labId: null, to: `${batch}-${i}@catcher.test`, subject: `Message ${i}`, text: '-' })));
      await t.db.manager.update(EmailOutbox, ids[i], { nextAttemptAt: new Date(Date.now() - (10 - i) * 1000) });
    }

    const sent: Sent[] = [];
    // The second delivery happens, then the database restarts before it is recorded.
    await expect(deliverDueEmails(t.db, recordingTransport(sent, async (n) => (n === 2 ? cutDatabaseConnections() : undefined)))).rejects.toThrow();
    expect(sent.map((s) => s.to)).toEqual([`${batch}-0@catcher.test`, `${batch}-1@catcher.test`]);

    const first = await t.db.manager.findOneByOrFail(EmailOutbox, { id: ids[0] });
    expect(first).toMatchObject({ status: 'sent', attempts: 1, messageId: outboxMessageId(ids[0]) });

    // The next round sends only what is left; the interrupted one waits out its lease.
    const again: Sent[] = [];
    await deliverDueEmails(t.db, recordingTransport(again));
    expect(again.map((s) => s.to)).toEqual([`${batch}-2@catcher.test`]);

    // Once its lease is over, the interrupted message goes again under the same Message-ID.
    await t.db.manager.update(EmailOutbox, ids[1], { nextAttemptAt: new Date(Date.now() - 1000) });
    const retry: Sent[] = [];
    await deliverDueEmails(t.db, recordingTransport(retry));
    expect(retry).toEqual([{ to: `${batch}-1@catcher.test`, messageId: sent[1].messageId }]);
    expect(sent[1].messageId).toBe(outboxMessageId(ids[1]));
    expect(outboxMessageId(ids[1])).toMatch(/^<outbox-[0-9a-f-]{36}@[a-z0-9.-]+>$/);
    expect(await t.db.manager.countBy(EmailOutbox, { id: ids[0], status: 'sent' })).toBe(1);
  });
});
