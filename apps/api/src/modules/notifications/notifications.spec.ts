import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { config } from '../../config';
import { clearMailbox, readMailbox, useTestApp } from '../../testing';
import { EmailOutbox } from '../mail/email-outbox.entity';
import { createMailTransport } from '../mail/mail-transport';
import { deliverDueEmails } from '../mail/outbox-worker';
import { demoReportContent } from '../reports/pdf/demo-report-content';
import { issueReport } from '../reports/issue-report';
import { insertSubmittedAnalysis } from '../reports/submitted-analysis.fixture';
import { notifyClientOrganisation, type OrganisationEvent } from './notify-client-organisation';

// The demo seed and report signing take seconds on a busy two-core machine.
jest.setTimeout(60_000);
const t = useTestApp();

const CALDER = { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' };

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

async function ids(): Promise<{ labId: string; hollin: string; sunvale: string; marlowLab: string; greyfield: string }> {
  const [row] = await t.db.query(
    `SELECT (SELECT id FROM lab WHERE name = 'Calder Analytical') AS "labId",
            (SELECT id FROM client_organisation WHERE name = 'Hollin Ridge Cellars') AS hollin,
            (SELECT id FROM client_organisation WHERE name = 'Sunvale Juice Works') AS sunvale,
            (SELECT id FROM lab WHERE name = 'Marlow Test House') AS "marlowLab",
            (SELECT id FROM client_organisation WHERE name = 'Greyfield Preserves') AS greyfield`,
  );
  return row;
}

/** Outbox rows and in-app rows whose subject carries `marker`. */
async function trail(marker: string) {
  const mails: EmailOutbox[] = await t.db.manager
    .createQueryBuilder(EmailOutbox, 'm')
    .where('m.subject LIKE :s', { s: `%${marker}%` })
    .orderBy('m.to_address')
    .getMany();
  const rows: Array<{ email: string; client_organisation_id: string; event: string; link: string | null }> = await t.db.query(
    `SELECT u.email, n.client_organisation_id, n.event, n.link FROM client_notification n JOIN app_user u ON u.id = n.user_id
      WHERE n.subject LIKE $1 ORDER BY u.email`,
    [`%${marker}%`],
  );
  return { mails, rows };
}

function expectLabEmail(mail: EmailOutbox): void {
  // Reply-To is the lab's contact (seeded for the demo lab), and nothing asks for a reply elsewhere.
  expect(mail.replyTo).toBe('lab@calder.test');
  expect(mail.html).toContain('<p');
  expect(mail.html).toContain('Calder Analytical');
  expect(mail.html).toContain('lab@calder.test');
  // No tracking pixel, image or remote resource of any kind.
  expect(mail.html).not.toMatch(/<img|src=|url\(|<link|<script/i);
  expect(mail.text).toContain('Questions? Contact Calder Analytical: e-mail lab@calder.test, phone +44 1632 960412 (invented).');
  expect(mail.text).toContain('Replies to this message reach Calder Analytical at lab@calder.test.');
}

describe('notifyClientOrganisation', () => {
  it('tells only the admins about money and orders, and everyone about reports; no other organisation hears of it', async () => {
    const { labId, hollin } = await ids();
    const send = (event: OrganisationEvent, marker: string) =>
      t.db.transaction((manager) =>
        notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event, subject: `Drill ${marker}`, text: `First paragraph <b>not markup</b>.\n\nSecond & last.`, link: '/orders' }),
      );

    const money = await send('payment-received', 'M1');
    expect(money.emailed).toEqual(['admin@hollinridge.test']);
    const m1 = await trail('M1');
    expect(m1.mails.map((m) => m.to)).toEqual(['admin@hollinridge.test']);
    expect(m1.rows).toEqual([{ email: 'admin@hollinridge.test', client_organisation_id: hollin, event: 'payment-received', link: '/orders' }]);
    expectLabEmail(m1.mails[0]);
    // The text is escaped in the HTML part, and the link is absolute in both parts.
    expect(m1.mails[0].html).toContain('First paragraph &lt;b&gt;not markup&lt;/b&gt;.');
    expect(m1.mails[0].html).toContain('Second &amp; last.');
    expect(m1.mails[0].text).toContain(`${config.publicBaseUrl}/orders`);
    expect(m1.mails[0].html).toContain(`href="${config.publicBaseUrl}/orders"`);

    await send('report-issued', 'R1');
    const r1 = await trail('R1');
    expect(r1.mails.map((m) => m.to)).toEqual(['admin@hollinridge.test', 'member@hollinridge.test']);
    expect(r1.rows.map((r) => r.email)).toEqual(['admin@hollinridge.test', 'member@hollinridge.test']);
    expect(r1.rows.every((r) => r.client_organisation_id === hollin)).toBe(true);
  });

  it('sends nothing when the organisation is not the lab’s (a wrong pair of ids reaches nobody)', async () => {
    const { marlowLab, hollin } = await ids();
    const result = await t.db.transaction((manager) =>
      notifyClientOrganisation(manager, { labId: marlowLab, clientOrganisationId: hollin, event: 'report-issued', subject: 'Drill X1', text: 'x' }),
    );
    expect(result).toEqual({ emailed: [], userIds: [] });
    expect(await trail('X1')).toEqual({ mails: [], rows: [] });
  });

  it('writes the in-app rows only when the caller sends its own e-mail (a receipt to the payer)', async () => {
    const { labId, hollin } = await ids();
    const result = await t.db.transaction((manager) =>
      notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event: 'payment-received', subject: 'Drill IA1', text: 'x', inAppOnly: true }),
    );
    expect(result.emailed).toEqual([]);
    const { mails, rows } = await trail('IA1');
    expect(mails).toEqual([]);
    expect(rows.map((r) => r.email)).toEqual(['admin@hollinridge.test']);
  });

  it('writes nothing when the caller’s transaction rolls back', async () => {
    const { labId, hollin } = await ids();
    await expect(
      t.db.transaction(async (manager) => {
        await notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event: 'order-placed', subject: 'Drill RB1', text: 'x' });
        throw new Error('the order failed');
      }),
    ).rejects.toThrow('the order failed');
    expect(await trail('RB1')).toEqual({ mails: [], rows: [] });
  });

  it('leaves out the reply line and Reply-To when the lab has no contact e-mail yet', async () => {
    const { labId, hollin } = await ids();
    await t.db.query(`UPDATE lab SET contact_email = '' WHERE id = $1`, [labId]);
    try {
      await t.db.transaction((manager) => notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event: 'order-placed', subject: 'Drill NC1', text: 'x' }));
      const [mail] = (await trail('NC1')).mails;
      expect(mail.replyTo).toBeNull();
      expect(mail.text).not.toMatch(/reply to this|replies to this message reach/i);
      expect(mail.text).toContain('This address does not receive replies');
    } finally {
      await t.db.query(`UPDATE lab SET contact_email = 'lab@calder.test' WHERE id = $1`, [labId]);
    }
  });
});

describe('client events', () => {
  const intake = () => t.authFor('intake-technician');
  const sampleId = async (code: string): Promise<string> => (await t.db.query('SELECT id FROM sample WHERE code = $1', [code]))[0].id;

  it('sample received: the ordering organisation’s admins get an e-mail and an in-app notice linking the order', async () => {
    const id = await sampleId('OP-3VNC-8P');
    const res = await request(t.app)
      .post(`/api/lab/samples/${id}/arrival`)
      .set(await intake())
      .send({ carrier: 'Invented Courier Co.', arrivedAt: new Date(Date.now() - 3_600_000).toISOString(), temperatureC: 6, sealIntact: true, containerCondition: 'intact', volumeMl: 750 });
    expect(res.status).toBe(200);
    const { mails, rows } = await trail('OP-3VNC-8P has arrived');
    expect(mails.map((m) => m.to)).toEqual(['admin@hollinridge.test']);
    expectLabEmail(mails[0]);
    const [{ order_id: orderId }] = await t.db.query('SELECT order_id FROM sample WHERE id = $1', [id]);
    expect(rows).toEqual([{ email: 'admin@hollinridge.test', client_organisation_id: (await ids()).hollin, event: 'sample-received', link: `/orders/${orderId}` }]);
  });

  it('sample rejected: the reason is in the e-mail, which does not ask for a reply to a no-reply sender', async () => {
    const id = await sampleId('OP-1PYF-9C');
    const res = await request(t.app).post(`/api/lab/samples/${id}/reject`).set(await intake()).send({ reason: 'Cap broken in transit; contents leaked.' });
    expect(res.status).toBe(200);
    const { mails, rows } = await trail('OP-1PYF-9C was not accepted');
    expect(mails.map((m) => m.to)).toEqual(['admin@sunvale.test']);
    expectLabEmail(mails[0]);
    expect(mails[0].text).toContain('Reason: Cap broken in transit; contents leaked.');
    expect(mails[0].html).toContain('Reason: Cap broken in transit; contents leaked.');
    expect(mails[0].text).not.toMatch(/reply to this message/i);
    expect(rows.map((r) => [r.email, r.event])).toEqual([['admin@sunvale.test', 'sample-rejected']]);
  });

  it('report issued, amended and revoked: every member of the organisation is told, by e-mail and in the app', async () => {
    const a = await insertSubmittedAnalysis(t.db.manager, CALDER);
    const report = await t.db.transaction((manager) =>
      issueReport(manager, {
        labId: a.labId,
        analysisId: a.analysisId,
        sampleId: a.sampleId,
        clientOrganisationId: a.clientOrganisationId,
        actorUserId: a.reviewerUserId,
        content: demoReportContent({ sample: { ...demoReportContent().sample, code: a.sampleCode } }),
      }),
    );
    const issued = await trail(`${report.number} is ready`);
    expect(issued.mails.map((m) => m.to)).toEqual(['admin@hollinridge.test', 'member@hollinridge.test']);
    issued.mails.forEach(expectLabEmail);
    expect(issued.rows.map((r) => [r.email, r.event, r.link])).toEqual([
      ['admin@hollinridge.test', 'report-issued', '/reports'],
      ['member@hollinridge.test', 'report-issued', '/reports'],
    ]);

    const reviewer = await t.authFor('reviewer');
    const amended = await request(t.app).post(`/api/lab/reports/${report.id}/amend`).set(reviewer).send({ reason: 'Lot corrected from the label.', corrections: { remarks: 'Lot corrected.' } });
    expect(amended.status).toBe(201);
    const am = await trail(`${report.number} has been amended`);
    expect(am.rows.map((r) => [r.email, r.event])).toEqual([
      ['admin@hollinridge.test', 'report-amended'],
      ['member@hollinridge.test', 'report-amended'],
    ]);
    expect(am.mails[0].text).toContain('Reason: Lot corrected from the label.');

    const revoked = await request(t.app).post(`/api/lab/reports/${amended.body.id}/revoke`).set(reviewer).send({ reason: 'Sample mix-up found.' });
    expect(revoked.status).toBe(200);
    const rv = await trail(`${amended.body.number} has been revoked`);
    expect(rv.rows.map((r) => [r.email, r.event])).toEqual([
      ['admin@hollinridge.test', 'report-revoked'],
      ['member@hollinridge.test', 'report-revoked'],
    ]);
    rv.mails.forEach(expectLabEmail);
  });

  it('invitation: HTML and text, with the lab’s name and contact and a working reply address', async () => {
    const email = `invitee-${randomUUID().slice(0, 8)}@hollinridge.test`;
    const res = await request(t.app).post('/api/client/team/invitations').set(await t.authFor('client-admin')).send({ email, role: 'client-member' });
    expect([200, 201]).toContain(res.status);
    const [mail] = await t.db.manager.find(EmailOutbox, { where: { to: email } });
    expectLabEmail(mail);
    expect(mail.text).toMatch(/accept-invitation\?token=/);
  });

  it('delivers through SMTP with Reply-To and both parts, read back from the mail catcher', async () => {
    const { labId, hollin } = await ids();
    const marker = randomUUID().slice(0, 8);
    await clearMailbox('admin@hollinridge.test');
    await t.db.transaction((manager) =>
      notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event: 'payment-received', subject: `Receipt ${marker}`, text: 'We received your payment.', link: '/orders' }),
    );
    // Deliver only this message: other files' tests share the mail catcher, not this database.
    await t.db.query(`UPDATE email_outbox SET status = 'sent' WHERE status = 'pending' AND subject NOT LIKE $1`, [`%${marker}%`]);
    const round = await deliverDueEmails(t.db, createMailTransport({ host: config.mail.host, port: config.mail.port, secure: false }));
    expect(round).toEqual({ sent: 1, failed: 0 });
    const caught = (await readMailbox('admin@hollinridge.test')).filter((m) => m.subject === `Receipt ${marker}`);
    expect(caught).toHaveLength(1);
    const mail = caught[0];
    expect(mail.text).toContain('We received your payment.');
    expect(mail.text).toContain('lab@calder.test');
    expect(mail.html).toContain('<p style="margin:0 0 14px">We received your payment.</p>');
    expect(mail.html).not.toMatch(/<img/i);
    // maildev's parsed headers leave Reply-To out; the raw message as delivered has it.
    const source = await (await fetch(`${process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1080'}/api/email/${mail.id}/source`)).text();
    expect(source).toMatch(/^Reply-To: lab@calder\.test\r?$/m);
    expect(source).toMatch(/^Content-Type: multipart\/alternative/m);
  });
});

describe('client notification routes', () => {
  const get = async (path: string, role: 'client-admin' | 'client-member' = 'client-member') => request(t.app).get(path).set(await t.authFor(role));

  it('lists my notifications newest first, counts unread, marks one and then all read', async () => {
    const { labId, hollin } = await ids();
    for (const n of [1, 2, 3]) {
      await t.db.transaction((manager) => notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event: 'report-issued', subject: `List drill ${n}`, text: `Body ${n}`, link: '/reports' }));
    }
    const before = (await get('/api/client/notifications/unread-count')).body.unread as number;
    expect(before).toBeGreaterThanOrEqual(3);
    const page = await get('/api/client/notifications?pageSize=2');
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ page: 1, pageSize: 2 });
    expect(page.body.items.map((i: { subject: string }) => i.subject)).toEqual(['List drill 3', 'List drill 2']);
    expect(page.body.items[0]).toMatchObject({ event: 'report-issued', body: 'Body 3', link: '/reports', readAt: null });

    const member = await t.authFor('client-member');
    const one = await request(t.app).post(`/api/client/notifications/${page.body.items[0].id}/read`).set(member);
    expect(one.status).toBe(200);
    expect(one.body.readAt).not.toBeNull();
    // Marking it again keeps the first reading time.
    const again = await request(t.app).post(`/api/client/notifications/${page.body.items[0].id}/read`).set(member);
    expect(again.body.readAt).toBe(one.body.readAt);
    expect((await get('/api/client/notifications/unread-count')).body.unread).toBe(before - 1);
    const unreadOnly = await get('/api/client/notifications?unread=true&pageSize=100');
    expect(unreadOnly.body.total).toBe(before - 1);

    const all = await request(t.app).post('/api/client/notifications/read-all').set(member);
    expect(all.body).toEqual({ marked: before - 1 });
    expect((await get('/api/client/notifications/unread-count')).body).toEqual({ unread: 0 });
    // The admin's own notifications are untouched by the member's reading.
    expect((await get('/api/client/notifications/unread-count', 'client-admin')).body.unread).toBeGreaterThanOrEqual(3);
  });

  it('answers 404 for another user’s notification and another tenant’s, and refuses staff and strangers', async () => {
    const { labId, hollin } = await ids();
    await t.db.transaction((manager) => notifyClientOrganisation(manager, { labId, clientOrganisationId: hollin, event: 'order-placed', subject: 'Admin-only drill', text: 'x' }));
    const [adminRow] = await t.db.query(`SELECT id FROM client_notification WHERE subject = 'Admin-only drill'`);
    const member = await t.authFor('client-member');
    expect((await request(t.app).post(`/api/client/notifications/${adminRow.id}/read`).set(member)).status).toBe(404);
    const marlow = await t.authFor('client-admin', 'marlow');
    expect((await request(t.app).post(`/api/client/notifications/${adminRow.id}/read`).set(marlow)).status).toBe(404);
    expect((await request(t.app).get('/api/client/notifications').set(marlow)).body.items.map((i: { subject: string }) => i.subject)).not.toContain('Admin-only drill');
    expect((await request(t.app).post('/api/client/notifications/read-all').set(marlow)).body).toEqual({ marked: 0 });
    const [still] = await t.db.query('SELECT read_at FROM client_notification WHERE id = $1', [adminRow.id]);
    expect(still.read_at).toBeNull();

    for (const [method, path] of [
      ['get', '/api/client/notifications'],
      ['get', '/api/client/notifications/unread-count'],
      ['post', '/api/client/notifications/read-all'],
      ['post', `/api/client/notifications/${adminRow.id}/read`],
    ] as const) {
      expect((await request(t.app)[method](path)).status).toBe(401);
      expect((await request(t.app)[method](path).set(await t.authFor('lab-admin'))).status).toBe(403);
    }
    expect((await request(t.app).post('/api/client/notifications/not-a-uuid/read').set(member)).status).toBe(400);
    expect((await request(t.app).get('/api/client/notifications?pageSize=100000').set(member)).status).toBe(400);
  });
});
