import { randomUUID } from 'node:crypto';
import type { Transporter } from 'nodemailer';
import { useTestApp } from '../../testing';
import { withMaintenanceConnection } from '../../testing/maintenance-db';
import { enqueueEmail } from './enqueue-email';
import { EmailOutbox } from './email-outbox.entity';
import { deliverDueEmails, deliverOutboxMessage, outboxMessageId } from './outbox-worker';

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
    // Right after the second delivery the database restarts (every connection is cut).
    await deliverDueEmails(t.db, recordingTransport(sent, async (n) => (n === 2 ? cutDatabaseConnections() : undefined))).catch(() => undefined);
    await deliverDueEmails(t.db, recordingTransport(sent));
    await deliverDueEmails(t.db, recordingTransport(sent));

    // Each message went out exactly once, under the Message-ID derived from its outbox row.
    const ours = sent.filter((m) => m.to.startsWith(batch));
    expect(ours.map((m) => m.to).sort()).toEqual([0, 1, 2].map((i) => `${batch}-${i}@catcher.test`));
    for (const [i, id] of ids.entries()) {
      expect(ours.find((m) => m.to === `${batch}-${i}@catcher.test`)?.messageId).toBe(outboxMessageId(id));
      expect(await t.db.manager.findOneByOrFail(EmailOutbox, { id })).toMatchObject({ status: 'sent', attempts: 1, messageId: outboxMessageId(id) });
    }
    expect(outboxMessageId(ids[0])).toMatch(/^<outbox-[0-9a-f-]{36}@[a-z0-9.-]+>$/);
  });

  it('sends a retried message under the same Message-ID as its first attempt', async () => {
    await t.db.manager.update(EmailOutbox, { status: 'pending' }, { status: 'sent' });
    const id = await t.db.transaction((m) => enqueueEmail(m, { labId: null, to: `retry-${randomUUID()}@catcher.test`, subject: 'Retry', text: '-' }));
    const ids: string[] = [];
    const failing = {
      async sendMail(mail: { messageId: string }) {
        ids.push(mail.messageId);
        throw new Error('451 try again later');
      },
    } as unknown as Transporter;
    expect(await deliverDueEmails(t.db, failing)).toEqual({ sent: 0, failed: 1 });
    await t.db.manager.update(EmailOutbox, id, { nextAttemptAt: new Date(Date.now() - 1000) });
    const sent: Sent[] = [];
    expect(await deliverDueEmails(t.db, recordingTransport(sent))).toEqual({ sent: 1, failed: 0 });
    expect(sent[0].messageId).toBe(ids[0]);
    expect(ids[0]).toBe(outboxMessageId(id));
  });

  it('sends a message once when two workers run its job and the sweep at the same moment, under its Message-ID', async () => {
    await t.db.manager.update(EmailOutbox, { status: 'pending' }, { status: 'sent' });
    const to = `twice-${randomUUID()}@catcher.test`;
    const id = await t.db.transaction((m) => enqueueEmail(m, { labId: null, to, subject: 'Once', text: '-' }));
    // the job committed with the message, ready for a worker
    const [job] = await t.db.query(`SELECT data->>'outboxId' AS outbox_id FROM pgboss.job WHERE name = 'email-send' AND data->>'outboxId' = $1`, [id]);
    expect(job).toEqual({ outbox_id: id });
    const sent: Sent[] = [];
    const slow = recordingTransport(sent, () => new Promise((r) => setTimeout(r, 200)));
    const outcomes = await Promise.all([deliverOutboxMessage(t.db, slow, id), deliverOutboxMessage(t.db, slow, id), deliverDueEmails(t.db, slow)]);
    expect(sent).toEqual([{ to, messageId: outboxMessageId(id) }]);
    expect(outcomes.filter((o) => o === 'sent')).toHaveLength(outcomes[2].sent === 1 ? 0 : 1);
    // a job delivered again later (pg-boss delivers at least once) sends nothing more
    expect(await deliverOutboxMessage(t.db, slow, id)).toBe('not-due');
    expect(sent).toHaveLength(1);
    expect(await t.db.manager.findOneByOrFail(EmailOutbox, { id })).toMatchObject({ status: 'sent', attempts: 1 });
  });
});
