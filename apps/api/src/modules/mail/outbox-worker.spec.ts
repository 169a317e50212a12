import { createServer, type AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { config } from '../../config';
import { readMailbox, useTestApp } from '../../testing';
import { enqueueEmail } from './enqueue-email';
import { EmailOutbox } from './email-outbox.entity';
import { createMailTransport } from './mail-transport';
import { deliverDueEmails, retryDelaySeconds } from './outbox-worker';

const t = useTestApp();

/** A port with nothing listening: bind one, note it, close it. */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

describe('e-mail outbox', () => {
  it('keeps a message through a mail-server outage and delivers it once the server is back', async () => {
    const to = `outbox-${randomUUID()}@catcher.test`;
    const id = await t.db.transaction((manager) => enqueueEmail(manager, { labId: null, to, subject: 'Outage drill', text: 'Delivered after the outage.' }));

    const down = createMailTransport({ host: '127.0.0.1', port: await closedPort(), secure: false });
    expect(await deliverDueEmails(t.db, down)).toEqual({ sent: 0, failed: 1 });
    const waiting = await t.db.manager.findOneByOrFail(EmailOutbox, { id });
    expect(waiting).toMatchObject({ status: 'pending', attempts: 1 });
    expect(waiting.lastError).toMatch(/ECONNREFUSED/);
    expect(waiting.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());

    // Not due yet: a second round leaves it alone.
    const up = createMailTransport({ host: config.mail.host, port: config.mail.port, secure: false });
    expect(await deliverDueEmails(t.db, up)).toEqual({ sent: 0, failed: 0 });

    await t.db.manager.update(EmailOutbox, id, { nextAttemptAt: new Date(Date.now() - 1000) });
    expect(await deliverDueEmails(t.db, up)).toEqual({ sent: 1, failed: 0 });
    const sent = await t.db.manager.findOneByOrFail(EmailOutbox, { id });
    expect(sent).toMatchObject({ status: 'sent', attempts: 2, lastError: null });

    const caught = await readMailbox(to);
    expect(caught).toHaveLength(1);
    expect(caught[0].subject).toBe('Outage drill');
    expect(caught[0].text.trim()).toBe('Delivered after the outage.');

    expect(await deliverDueEmails(t.db, up)).toEqual({ sent: 0, failed: 0 });
    expect(await readMailbox(to)).toHaveLength(1);
  });

  it('marks a message failed after the configured number of attempts, keeping it and its last error', async () => {
    const id = await t.db.transaction((manager) => enqueueEmail(manager, { labId: null, to: 'never@catcher.test', subject: 'Doomed', text: '-' }));
    await t.db.manager.update(EmailOutbox, id, { attempts: config.mail.maxAttempts - 1 });
    await deliverDueEmails(t.db, createMailTransport({ host: '127.0.0.1', port: await closedPort(), secure: false }));
    const row = await t.db.manager.findOneByOrFail(EmailOutbox, { id });
    expect(row.status).toBe('failed');
    expect(row.attempts).toBe(config.mail.maxAttempts);
    expect(row.lastError).toMatch(/ECONNREFUSED/);
  });

  it('backs off exponentially up to an hour', () => {
    expect([1, 2, 3, 4].map(retryDelaySeconds)).toEqual([15, 30, 60, 120]);
    expect(retryDelaySeconds(30)).toBe(3600);
  });

  it('sends nothing when the change that queued it rolls back', async () => {
    const to = `rollback-${randomUUID()}@catcher.test`;
    await expect(
      t.db.transaction(async (manager) => {
        await enqueueEmail(manager, { labId: null, to, subject: 'Never', text: '-' });
        throw new Error('the business change failed');
      }),
    ).rejects.toThrow('the business change failed');
    expect(await t.db.manager.count(EmailOutbox, { where: { to } })).toBe(0);
  });
});
