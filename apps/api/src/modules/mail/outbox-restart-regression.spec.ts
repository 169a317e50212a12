import { randomUUID } from 'node:crypto';
import type { Transporter } from 'nodemailer';
import request from 'supertest';
import { useTestApp } from '../../testing';
import { clearMailbox } from '../../testing/mailbox';
import { withMaintenanceConnection } from '../../testing/maintenance-db';
import { createMailTransport } from './mail-transport';
import { deliverDueEmails, outboxMessageId } from './outbox-worker';

/**
 * Issue 10, "Nothing lost, nothing twice": "the outbox sends inside one database transaction per
 * batch, so a PostgreSQL restart mid-batch sent 2 of 40 invitations twice. Commit each message's
 * state on its own and give every message a stable Message-ID." The issue's own scenario, end to
 * end: forty invitations through the route, sent over real SMTP to the mail catcher, every
 * database connection cut in the middle of the round; each invitee receives exactly one e-mail,
 * carrying its outbox row's Message-ID.
 */
jest.setTimeout(120_000);
const t = useTestApp();

interface Caught {
  id: string;
  subject: string;
  messageId?: string;
  headers?: Record<string, string>;
  to: { address: string }[];
}

async function caughtFor(prefix: string): Promise<Caught[]> {
  const res = await fetch(`${process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1080'}/api/email`);
  const all = (await res.json()) as Caught[];
  return all.filter((m) => m.to.some((to) => to.address.startsWith(prefix)));
}

describe('forty invitations and a database restart mid-round', () => {
  const batch = `restart-${randomUUID().slice(0, 8)}`;
  const addresses = Array.from({ length: 40 }, (_, i) => `${batch}-${i}@invitees.test`);
  afterAll(async () => {
    for (const a of addresses) await clearMailbox(a);
  });

  it('delivers each invitation exactly once over SMTP, under its own stable Message-ID', async () => {
    const admin = await t.authFor('lab-admin');
    for (const email of addresses) {
      await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email, roles: ['analyst'] }).expect(201);
    }
    // only this test's messages are due, oldest first in the order they were queued
    await t.db.query(`UPDATE email_outbox SET status = 'sent' WHERE status = 'pending' AND to_address NOT LIKE $1`, [`${batch}-%`]);
    await t.db.query(`UPDATE email_outbox SET next_attempt_at = now() - interval '1 minute' WHERE status = 'pending'`);

    const real = createMailTransport();
    let sent = 0;
    const cutting = {
      async sendMail(mail: Parameters<Transporter['sendMail']>[0]) {
        const info = await real.sendMail(mail);
        sent += 1;
        // after the 15th message is handed to SMTP (and before its state is recorded), PostgreSQL restarts
        if (sent === 15) {
          await withMaintenanceConnection((c) => c.query('SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()', [t.databaseName]));
        }
        return info;
      },
    } as unknown as Transporter;
    for (let round = 0; round < 6; round++) await deliverDueEmails(t.db, cutting).catch(() => undefined);
    real.close();

    const caught = await caughtFor(`${batch}-`);
    const perAddress = addresses.map((a) => caught.filter((m) => m.to.some((to) => to.address === a)).length);
    expect(perAddress).toEqual(Array(40).fill(1));

    const rows: { id: string; to: string; status: string; message_id: string }[] = await t.db.query(
      `SELECT id, to_address AS "to", status, message_id FROM email_outbox WHERE to_address LIKE $1`,
      [`${batch}-%`],
    );
    expect(rows).toHaveLength(40);
    for (const row of rows) {
      expect(row).toMatchObject({ status: 'sent', message_id: outboxMessageId(row.id) });
      const mail = caught.find((m) => m.to.some((to) => to.address === row.to))!;
      const header = mail.messageId ?? mail.headers?.['message-id'];
      expect([row.to, header?.replace(/^<|>$/g, '')]).toEqual([row.to, outboxMessageId(row.id).replace(/^<|>$/g, '')]);
    }
  });
});
