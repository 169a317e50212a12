import request from 'supertest';
import { config } from '../../config';
import { readMailbox, useTestApp } from '../../testing';
import { balanceOf, checkout, createPack, useBillingKit, waitForStatus } from '../../testing/billing-kit';
import { reserveCredits } from '../credits/credit-ledger';
import { createMailTransport } from '../mail/mail-transport';
import { deliverDueEmails } from '../mail/outbox-worker';

jest.setTimeout(90_000);
const t = useTestApp();
const { kit } = useBillingKit(t);

async function orgOf(lab: 'calder' | 'marlow' = 'calder'): Promise<string> {
  const [row] = await t.db.query('SELECT m.client_organisation_id FROM client_membership m JOIN app_user u ON u.id = m.user_id WHERE u.email = $1',
    [lab === 'calder' ? 'admin@hollinridge.test' : 'admin@greyfield.test']);
  return row.client_organisation_id;
}

async function paidCheckout(packId: string) {
  const started = await checkout(t, packId);
  await kit().pay.press(started.checkoutUrl, 'pay');
  await waitForStatus(t, started.sessionId, 'paid');
  const [row] = await t.db.query('SELECT id FROM payment WHERE checkout_session_id = $1', [started.sessionId]);
  return { ...started, paymentId: row.id as string };
}

describe('prices and credit packs (lab admin)', () => {
  it('keeps credits per check sample and per reference lot, audited', async () => {
    const admin = await t.authFor('lab-admin');
    expect((await request(t.app).get('/api/lab/credit-prices').set(admin)).body).toEqual({ creditsPerCheckSample: 1, creditsPerReferenceLot: 1 });
    const bad = await request(t.app).put('/api/lab/credit-prices').set(admin).send({ creditsPerCheckSample: 0, creditsPerReferenceLot: 1.5 });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['creditsPerCheckSample', 'creditsPerReferenceLot']);
    const put = await request(t.app).put('/api/lab/credit-prices').set(admin).send({ creditsPerCheckSample: 2, creditsPerReferenceLot: 3 });
    expect(put.status).toBe(200);
    expect((await request(t.app).get('/api/lab/credit-prices').set(admin)).body).toEqual({ creditsPerCheckSample: 2, creditsPerReferenceLot: 3 });
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'credit-prices.changed'`);
    expect(audit.details.after).toEqual({ creditsPerCheckSample: 2, creditsPerReferenceLot: 3 });
  });

  it('makes a product and price per pack; a new price retires the old one; retiring hides the pack from clients', async () => {
    const pack = await createPack(t, { name: 'Starter', credits: 5, price: 7000, currency: 'EUR' });
    const price = await kit().sdk.prices.retrieve(pack.paymentPriceId);
    expect(price).toMatchObject({ unit_amount: 7000, currency: 'eur', product: pack.paymentProductId, active: true });
    expect((await kit().sdk.products.retrieve(pack.paymentProductId)).name).toBe('Starter');

    const admin = await t.authFor('lab-admin');
    const edited = await request(t.app).patch(`/api/lab/credit-packs/${pack.id}`).set(admin).send({ price: 6500, name: 'Starter pack' });
    expect(edited.status).toBe(200);
    expect(edited.body.paymentPriceId).not.toBe(pack.paymentPriceId);
    expect((await kit().sdk.prices.retrieve(pack.paymentPriceId)).active).toBe(false);
    expect(await kit().sdk.prices.retrieve(edited.body.paymentPriceId)).toMatchObject({ unit_amount: 6500, active: true });
    expect((await kit().sdk.products.retrieve(pack.paymentProductId)).name).toBe('Starter pack');
    const renamedOnly = await request(t.app).patch(`/api/lab/credit-packs/${pack.id}`).set(admin).send({ name: 'Starter five' });
    expect(renamedOnly.body.paymentPriceId).toBe(edited.body.paymentPriceId);

    const offers = await request(t.app).get('/api/client/credit-packs').set(await t.authFor('client-member'));
    expect(offers.body).toContainEqual({ id: pack.id, name: 'Starter five', credits: 5, price: 6500, currency: 'eur' });

    const retired = await request(t.app).patch(`/api/lab/credit-packs/${pack.id}`).set(admin).send({ active: false });
    expect(retired.body.active).toBe(false);
    expect((await kit().sdk.prices.retrieve(edited.body.paymentPriceId)).active).toBe(false);
    const after = await request(t.app).get('/api/client/credit-packs').set(await t.authFor('client-member'));
    expect(after.body.map((p: { id: string }) => p.id)).not.toContain(pack.id);
    const buy = await request(t.app).post('/api/client/credit-checkouts').set(await t.authFor('client-admin')).send({ packId: pack.id });
    expect(buy.status).toBe(409);
  });

  it('refuses bad pack input with field errors', async () => {
    const admin = await t.authFor('lab-admin');
    // A NUL byte is refused before anything else is read, naming its field.
    const nul = await request(t.app).post('/api/lab/credit-packs').set(admin).send({ name: 'x\u0000y', credits: 5, price: 1250, currency: 'eur' });
    expect(nul.status).toBe(400);
    expect(nul.body.errors.map((e: { field: string }) => e.field)).toEqual(['name']);
    const bad = await request(t.app).post('/api/lab/credit-packs').set(admin).send({ name: '', credits: 0, price: 12.5, currency: 'euro' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['credits', 'currency', 'name', 'price']);
    const huge = await request(t.app).post('/api/lab/credit-packs').set(admin).send({ name: 'A'.repeat(5000), credits: 1, price: 1, currency: 'eur' });
    expect(huge.status).toBe(400);
    expect((await request(t.app).patch('/api/lab/credit-packs/not-a-uuid').set(admin).send({ name: 'x' })).status).toBe(400);
  });
});

describe('refunds and adjustments (lab admin)', () => {
  let packId: string;
  beforeAll(async () => {
    packId = (await createPack(t, { name: 'Refundable', credits: 4, price: 5000, currency: 'eur' })).id;
  });

  it('refunds a paid pack whose credits are unused: money back at the payment service, credits out of the ledger', async () => {
    const before = await balanceOf(t);
    const { paymentId } = await paidCheckout(packId);
    const res = await request(t.app).post(`/api/lab/payments/${paymentId}/refund`).set(await t.authFor('lab-admin'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'refunded', credits: 4 });
    expect(res.body.refundedBy.displayName).toBeTruthy();
    expect(await balanceOf(t)).toEqual(before);
    const [row] = await t.db.query('SELECT refund_id, payment_intent_id FROM payment WHERE id = $1', [paymentId]);
    const refund = await kit().sdk.refunds.retrieve(row.refund_id);
    expect(refund).toMatchObject({ amount: 5000, payment_intent: row.payment_intent_id, status: 'succeeded' });
    const again = await request(t.app).post(`/api/lab/payments/${paymentId}/refund`).set(await t.authFor('lab-admin'));
    expect(again.status).toBe(409);
    expect(again.body.type).toBe('urn:ohmprint:problem:already-refunded');
    const ledger = await request(t.app).get('/api/client/ledger?kind=refund').set(await t.authFor('client-admin'));
    expect(ledger.body.items[0]).toMatchObject({ kind: 'refund', availableChange: -4, reference: { type: 'payment' } });
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'payment.refunded' AND subject_id = $1`, [paymentId]);
    expect(audit.details).toMatchObject({ credits: 4, amount: 5000 });
  });

  it('refuses a refund once the credits are held for orders, saying why, and changes nothing', async () => {
    const { paymentId } = await paidCheckout(packId);
    const org = await orgOf();
    const { available } = await balanceOf(t);
    const [{ lab_id: labId }] = await t.db.query('SELECT lab_id FROM client_organisation WHERE id = $1', [org]);
    await t.db.transaction((m) => reserveCredits(m, { labId, clientOrganisationId: org }, available - 2, { reason: 'Order held (test)', actorUserId: null }));
    const res = await request(t.app).post(`/api/lab/payments/${paymentId}/refund`).set(await t.authFor('lab-admin'));
    expect(res.status).toBe(409);
    expect(res.body.type).toBe('urn:ohmprint:problem:credits-in-use');
    expect(res.body.detail).toMatch(/added 4 credits.*only 2 available/);
    expect(res.body).toMatchObject({ credits: 4, available: 2 });
    const [row] = await t.db.query('SELECT status, refund_id FROM payment WHERE id = $1', [paymentId]);
    expect(row).toEqual({ status: 'paid', refund_id: null });
    expect((await balanceOf(t)).available).toBe(2);
  });

  it('refuses to refund what was never paid, and another lab’s payment is not found', async () => {
    const open = await checkout(t, packId);
    const [row] = await t.db.query('SELECT id FROM payment WHERE checkout_session_id = $1', [open.sessionId]);
    const res = await request(t.app).post(`/api/lab/payments/${row.id}/refund`).set(await t.authFor('lab-admin'));
    expect(res.status).toBe(409);
    expect(res.body.type).toBe('urn:ohmprint:problem:not-paid');
    expect((await request(t.app).post(`/api/lab/payments/${row.id}/refund`).set(await t.authFor('lab-admin', 'marlow'))).status).toBe(404);
    const marlowList = await request(t.app).get('/api/lab/payments').set(await t.authFor('lab-admin', 'marlow'));
    expect(marlowList.body.total).toBe(0);
  });

  it('adjusts credits by hand only with a reason, and audits it', async () => {
    const org = await orgOf();
    const admin = await t.authFor('lab-admin');
    const before = await balanceOf(t);
    const noReason = await request(t.app).post('/api/lab/credit-adjustments').set(admin).send({ clientOrganisationId: org, change: 3 });
    expect(noReason.status).toBe(400);
    expect(noReason.body.errors[0].field).toBe('reason');
    expect((await request(t.app).post('/api/lab/credit-adjustments').set(admin).send({ clientOrganisationId: org, change: 3, reason: '   ' })).status).toBe(400);
    expect((await request(t.app).post('/api/lab/credit-adjustments').set(admin).send({ clientOrganisationId: org, change: 0, reason: 'Nothing at all' })).status).toBe(400);
    const ok = await request(t.app).post('/api/lab/credit-adjustments').set(admin).send({ clientOrganisationId: org, change: 3, reason: 'Goodwill for a late report' });
    expect(ok.status).toBe(201);
    expect(ok.body.balance.available).toBe(before.available + 3);
    const [audit] = await t.db.query(`SELECT actor_user_id, details FROM audit_event WHERE action = 'credits.adjusted' AND subject_id = $1 ORDER BY created_at DESC LIMIT 1`, [org]);
    expect(audit.details).toMatchObject({ change: 3, reason: 'Goodwill for a late report', ledgerEntryId: ok.body.entryId });
    expect(audit.actor_user_id).toBe(await t.userIdFor('lab-admin'));
    const ledger = await request(t.app).get('/api/client/ledger?q=goodwill').set(await t.authFor('client-member'));
    expect(ledger.body.items[0]).toMatchObject({ kind: 'adjustment', availableChange: 3, reference: { type: 'adjustment', label: 'Manual adjustment' } });
    const tooMuch = await request(t.app).post('/api/lab/credit-adjustments').set(admin).send({ clientOrganisationId: org, change: -100000, reason: 'Remove more than held' });
    expect(tooMuch.status).toBe(409);
    expect(tooMuch.body.type).toBe('urn:ohmprint:problem:insufficient-credits');
    const otherLab = await request(t.app).post('/api/lab/credit-adjustments').set(await t.authFor('lab-admin', 'marlow')).send({ clientOrganisationId: org, change: 1, reason: 'Not my client' });
    expect(otherLab.status).toBe(404);
    const accounts = await request(t.app).get('/api/lab/credit-accounts?q=hollin').set(admin);
    expect(accounts.body.items[0]).toMatchObject({ clientOrganisation: { id: org }, available: before.available + 3 });
  });
});

describe('receipt e-mail', () => {
  it('sends a receipt per payment with the lab’s name and contact, HTML and plain text, without images', async () => {
    const pack = await createPack(t, { name: 'Receipt pack', credits: 2, price: 3150, currency: 'gbp' });
    const payer = 'admin@hollinridge.test';
    await paidCheckout(pack.id);
    const [queued] = await t.db.query(`SELECT id FROM email_outbox WHERE to_address = $1 AND subject LIKE 'Receipt%' ORDER BY created_at DESC LIMIT 1`, [payer]);
    expect(queued).toBeDefined();
    await t.db.query(`UPDATE email_outbox SET subject = subject || ' [' || $2 || ']' WHERE id = $1`, [queued.id, t.databaseName]);
    await deliverDueEmails(t.db, createMailTransport({ host: config.mail.host, port: config.mail.port, secure: false }));
    const mail = (await readMailbox(payer)).find((m) => m.subject.includes(t.databaseName))!;
    expect(mail.subject).toMatch(/^Receipt R-\d{6} from Calder Analytical: 2 test credits/);
    expect(mail.text).toContain('Calder Analytical received your payment');
    expect(mail.text).toContain('£31.50');
    expect(mail.text).toContain('Receipt pack: 2 test credits');
    expect(mail.text).toMatch(/reply to lab@calder\.test/);
    expect(mail.html).toContain('<table');
    expect(mail.html).not.toMatch(/<img/i);
  });
});

describe('who may call the billing routes', () => {
  const lab = [
    ['get', '/api/lab/credit-prices'], ['put', '/api/lab/credit-prices'], ['get', '/api/lab/credit-packs'], ['post', '/api/lab/credit-packs'],
    ['patch', '/api/lab/credit-packs/00000000-0000-4000-8000-000000000000'], ['get', '/api/lab/payments'],
    ['post', '/api/lab/payments/00000000-0000-4000-8000-000000000000/refund'], ['get', '/api/lab/credit-accounts'], ['post', '/api/lab/credit-adjustments'],
  ] as const;
  const client = [
    ['get', '/api/client/credits'], ['get', '/api/client/credit-packs'], ['post', '/api/client/credit-checkouts'],
    ['get', '/api/client/credit-checkouts/cs_test_x'], ['post', '/api/client/credit-checkouts/cs_test_x/abandon'], ['get', '/api/client/ledger'], ['get', '/api/client/payments'],
  ] as const;

  it.each([...lab, ...client])('%s %s needs a sign-in', async (method, path) => {
    expect((await request(t.app)[method](path)).status).toBe(401);
  });

  it.each(lab)('%s %s is for lab admins only', async (method, path) => {
    for (const role of ['analyst', 'reviewer', 'intake-technician', 'client-admin', 'platform-operator'] as const) {
      expect([role, (await request(t.app)[method](path).set(await t.authFor(role)).send({})).status]).toEqual([role, 403]);
    }
  });

  it.each(client)('%s %s is for the client organisation only', async (method, path) => {
    for (const role of ['lab-admin', 'analyst', 'platform-operator'] as const) {
      expect([role, (await request(t.app)[method](path).set(await t.authFor(role)).send({})).status]).toEqual([role, 403]);
    }
  });

  it('a client member reads but cannot buy', async () => {
    const pack = await createPack(t, { name: 'Member pack', credits: 1, price: 100, currency: 'eur' });
    expect((await request(t.app).post('/api/client/credit-checkouts').set(await t.authFor('client-member')).send({ packId: pack.id })).status).toBe(403);
  });

  it('another lab’s packs, checkouts, payments and ledger stay out of reach', async () => {
    const pack = await createPack(t, { name: 'Calder only', credits: 1, price: 100, currency: 'eur' });
    const greyfield = await t.authFor('client-admin', 'marlow');
    expect((await request(t.app).post('/api/client/credit-checkouts').set(greyfield).send({ packId: pack.id })).status).toBe(404);
    expect((await request(t.app).get('/api/client/credit-packs').set(greyfield)).body).toEqual([]);
    const mine = await checkout(t, pack.id);
    expect((await request(t.app).get(`/api/client/credit-checkouts/${mine.sessionId}`).set(greyfield)).status).toBe(404);
    expect((await request(t.app).post(`/api/client/credit-checkouts/${mine.sessionId}/abandon`).set(greyfield)).status).toBe(404);
    expect((await request(t.app).get('/api/client/payments').set(greyfield)).body.total).toBe(0);
    expect((await request(t.app).get('/api/client/ledger').set(greyfield)).body.total).toBe(0);
    expect((await request(t.app).get('/api/client/credits').set(greyfield)).body).toEqual({ available: 0, reserved: 0 });
    expect((await request(t.app).patch(`/api/lab/credit-packs/${pack.id}`).set(await t.authFor('lab-admin', 'marlow')).send({ name: 'Mine now' })).status).toBe(404);
    expect((await request(t.app).get('/api/lab/credit-packs').set(await t.authFor('lab-admin', 'marlow'))).body).toEqual([]);
  });

  it('every billing route is in the OpenAPI document', async () => {
    const doc = (await request(t.app).get('/api/openapi.json')).body;
    for (const [method, path] of [...lab, ...client, ['post', '/api/payments/webhook']] as const) {
      const templated = path.replace(/00000000-0000-4000-8000-000000000000/, '{id}').replace(/cs_test_x/, '{sessionId}');
      expect([templated, Boolean(doc.paths[templated]?.[method])]).toEqual([templated, true]);
    }
  });
});
