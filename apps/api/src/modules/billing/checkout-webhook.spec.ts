import request from 'supertest';
import { useTestApp } from '../../testing';
import { balanceOf, checkout, createPack, paymentStatus, postEvent, signedEvent, useBillingKit, waitForStatus } from '../../testing/billing-kit';
import { eventually } from '../../testing/payment-service';

jest.setTimeout(90_000);
const t = useTestApp();
const { kit } = useBillingKit(t);

let pack: Awaited<ReturnType<typeof createPack>>;
beforeAll(async () => {
  pack = await createPack(t, { name: 'Ten checks', credits: 10, price: 12500, currency: 'eur' });
});

const purchases = async (sessionId: string): Promise<number> => {
  const [row] = await t.db.query(
    `SELECT count(*)::int AS n FROM credit_ledger_entry e JOIN payment p ON p.id = e.payment_id WHERE p.checkout_session_id = $1 AND e.kind = 'purchase'`, [sessionId]);
  return row.n;
};

describe('buying a credit pack through the local payment service', () => {
  it('creates a checkout for the organisation’s customer with the pack’s price and our metadata', async () => {
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    expect(checkoutUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/checkout\/cs_test_/);
    const session = await kit().sdk.checkout.sessions.retrieve(sessionId);
    expect(session).toMatchObject({ mode: 'payment', status: 'open', payment_status: 'unpaid', amount_total: 12500, currency: 'eur' });
    expect(session.metadata).toMatchObject({ ohmprint_pack_id: pack.id });
    expect(session.success_url).toContain('/credits/bought?session=');
    const items = await kit().sdk.checkout.sessions.listLineItems(sessionId);
    expect(items.data[0].price?.id).toBe(pack.paymentPriceId);
    const second = await checkout(t, pack.id);
    expect((await kit().sdk.checkout.sessions.retrieve(second.sessionId)).customer).toBe(session.customer);
    const page = await fetch(checkoutUrl);
    const html = await page.text();
    expect(html).toContain('Local test checkout');
    expect(html).toMatch(/Pay €125\.00/);
    expect(html).toContain('Decline');
  });

  it('pays on the test page: the signed webhook adds the credits once and the receipt is queued', async () => {
    const before = await balanceOf(t);
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    expect(await kit().pay.press(checkoutUrl, 'pay')).toBe(303);
    await waitForStatus(t, sessionId, 'paid');
    expect(await balanceOf(t)).toEqual({ available: before.available + 10, reserved: before.reserved });
    const ledger = await request(t.app).get('/api/client/ledger').set(await t.authFor('client-member'));
    expect(ledger.status).toBe(200);
    expect(ledger.body.items[0]).toMatchObject({ kind: 'purchase', availableChange: 10, availableAfter: before.available + 10, reason: 'Bought Ten checks',
      reference: { type: 'payment' } });
    expect(ledger.body.items[0].actor.displayName).toBeTruthy();
    const status = await request(t.app).get(`/api/client/credit-checkouts/${sessionId}`).set(await t.authFor('client-member'));
    expect(status.body).toMatchObject({ status: 'paid', credits: 10 });
    const payments = await request(t.app).get('/api/client/payments?status=paid').set(await t.authFor('client-member'));
    expect(payments.body.items.map((p: { sessionId: string }) => p.sessionId)).toContain(sessionId);
    // Every delivery of the fake reached the API and was accepted.
    const done = await eventually(async () => (await kit().pay.deliveries()).every((d) => d.state === 'delivered'), 10_000, 'all deliveries');
    expect(done).toBe(true);
  });

  it('refuses a tampered or unsigned notification with 400 and adds nothing', async () => {
    const { sessionId } = await checkout(t, pack.id);
    const session = await kit().sdk.checkout.sessions.retrieve(sessionId);
    const event = signedEvent(kit(), 'checkout.session.completed', { ...session, payment_status: 'paid', status: 'complete' });
    const tampered = await postEvent(t, { payload: event.payload.replace('"unpaid"', '"paid"').replace('12500', '1'), signature: event.signature });
    expect(tampered.status).toBe(400);
    expect(tampered.headers['content-type']).toMatch(/problem\+json/);
    expect(tampered.body.type).toBe('urn:ohmprint:problem:bad-webhook-signature');
    const unsigned = await request(t.app).post('/api/payments/webhook').set('Content-Type', 'application/json').send(event.payload);
    expect(unsigned.status).toBe(400);
    const wrongSecret = kit().sdk.webhooks.generateTestHeaderString({ payload: event.payload, secret: 'whsec_someone_else' });
    expect((await postEvent(t, { payload: event.payload, signature: wrongSecret })).status).toBe(400);
    const stale = kit().sdk.webhooks.generateTestHeaderString({ payload: event.payload, secret: kit().pay.webhookSecret, timestamp: Math.floor(Date.now() / 1000) - 3600 });
    expect((await postEvent(t, { payload: event.payload, signature: stale })).status).toBe(400);
    const nul = await request(t.app).post('/api/payments/webhook').set('Stripe-Signature', 't=1,v1=' + 'f'.repeat(5000)).set('Content-Type', 'application/json').send('{"id":"\u0000"}');
    expect(nul.status).toBe(400);
    expect(await purchases(sessionId)).toBe(0);
  });

  it('counts a replayed event once, also when replayed concurrently', async () => {
    const before = await balanceOf(t);
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    await kit().pay.press(checkoutUrl, 'pay');
    await waitForStatus(t, sessionId, 'paid');
    const original = (await kit().pay.events('checkout.session.completed')).find((e) => e.data.object.id === sessionId)!;
    await kit().pay.resend(original.id);
    const session = await kit().sdk.checkout.sessions.retrieve(sessionId);
    const same = signedEvent(kit(), 'checkout.session.completed', session);
    const answers = await Promise.all(Array.from({ length: 8 }, () => postEvent(t, same)));
    expect(answers.map((a) => a.status)).toEqual(Array(8).fill(200));
    expect(answers.filter((a) => a.body.outcome === 'already-credited')).toHaveLength(1);
    expect(answers.filter((a) => a.body.outcome === 'duplicate-event')).toHaveLength(7);
    await eventually(async () => (await t.db.query('SELECT outcome FROM payment_webhook_event WHERE event_id = $1', [original.id]))[0]?.outcome === 'credited');
    await new Promise((r) => setTimeout(r, 500));
    expect(await purchases(sessionId)).toBe(1);
    expect((await balanceOf(t)).available).toBe(before.available + 10);
  });

  it('ignores events out of order: a late “expired” or “declined” does not undo a paid checkout', async () => {
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    await kit().pay.press(checkoutUrl, 'pay');
    await waitForStatus(t, sessionId, 'paid');
    const after = await balanceOf(t);
    const session = await kit().sdk.checkout.sessions.retrieve(sessionId);
    expect((await postEvent(t, signedEvent(kit(), 'checkout.session.expired', { ...session, status: 'expired' }))).body.outcome).toBe('ignored-paid');
    const intent = await kit().sdk.paymentIntents.retrieve(session.payment_intent as string);
    expect((await postEvent(t, signedEvent(kit(), 'payment_intent.payment_failed', intent))).body.outcome).toBe('ignored-paid');
    expect(await paymentStatus(t, sessionId)).toBe('paid');
    expect(await balanceOf(t)).toEqual(after);
  });

  it('adds nothing for a session it did not create, nor for one not paid', async () => {
    const before = await balanceOf(t);
    const foreign = await kit().sdk.checkout.sessions.create({ mode: 'payment', line_items: [{ price: pack.paymentPriceId, quantity: 1 }], success_url: 'http://127.0.0.1/x',
      metadata: { ohmprint_pack_id: pack.id } });
    await kit().pay.press(foreign.url!, 'pay');
    await eventually(async () => (await t.db.query(`SELECT 1 FROM payment_webhook_event WHERE checkout_session_id = $1 AND type = 'checkout.session.completed' AND outcome = 'unknown-session'`, [foreign.id])).length > 0,
      10_000, 'the unknown session being recorded');
    const made = await kit().sdk.checkout.sessions.retrieve(foreign.id);
    expect((await postEvent(t, signedEvent(kit(), 'checkout.session.completed', made))).body.outcome).toBe('unknown-session');
    expect((await postEvent(t, signedEvent(kit(), 'checkout.session.completed', { ...made, id: 'cs_test_never_made' }))).body.outcome).toBe('unknown-session');

    const { sessionId } = await checkout(t, pack.id);
    const open = await kit().sdk.checkout.sessions.retrieve(sessionId);
    // The event claims paid; the payment service says otherwise, and it is the one believed.
    const claim = await postEvent(t, signedEvent(kit(), 'checkout.session.completed', { ...open, status: 'complete', payment_status: 'paid' }));
    expect(claim.body.outcome).toBe('not-paid');
    expect(await paymentStatus(t, sessionId)).toBe('open');
    expect(await balanceOf(t)).toEqual(before);
  });

  it('a declined card adds nothing and says so; the same checkout can still be paid', async () => {
    const before = await balanceOf(t);
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    expect(await kit().pay.press(checkoutUrl, 'decline')).toBe(402);
    await waitForStatus(t, sessionId, 'declined');
    const listed = await request(t.app).get('/api/client/payments?status=declined').set(await t.authFor('client-admin'));
    const row = listed.body.items.find((p: { sessionId: string }) => p.sessionId === sessionId);
    expect(row.failureMessage).toMatch(/declined/i);
    expect(await balanceOf(t)).toEqual(before);
    await kit().pay.press(checkoutUrl, 'pay');
    await waitForStatus(t, sessionId, 'paid');
    expect((await balanceOf(t)).available).toBe(before.available + 10);
  });

  it('an abandoned checkout expires, adds nothing and cannot be paid afterwards', async () => {
    const before = await balanceOf(t);
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    const member = await request(t.app).post(`/api/client/credit-checkouts/${sessionId}/abandon`).set(await t.authFor('client-member'));
    expect(member.status).toBe(403);
    const abandon = await request(t.app).post(`/api/client/credit-checkouts/${sessionId}/abandon`).set(await t.authFor('client-admin'));
    expect(abandon.status).toBe(200);
    await waitForStatus(t, sessionId, 'expired');
    expect((await kit().sdk.checkout.sessions.retrieve(sessionId)).status).toBe('expired');
    const page = await (await fetch(checkoutUrl)).text();
    expect(page).toContain('expired');
    await kit().pay.press(checkoutUrl, 'pay');
    expect(await paymentStatus(t, sessionId)).toBe('expired');
    expect(await balanceOf(t)).toEqual(before);
  });

  it('20 concurrent checkouts make one customer and, once paid, add exactly 20 packs', async () => {
    const before = await balanceOf(t);
    const started = await Promise.all(Array.from({ length: 20 }, () => checkout(t, pack.id)));
    expect(new Set(started.map((s) => s.sessionId)).size).toBe(20);
    const sessions = await Promise.all(started.map((s) => kit().sdk.checkout.sessions.retrieve(s.sessionId)));
    expect(new Set(sessions.map((s) => s.customer)).size).toBe(1);
    const [{ n: customers }] = await t.db.query('SELECT count(*)::int AS n FROM payment_customer WHERE customer_id IS NOT NULL');
    expect(customers).toBe(1);
    await Promise.all(started.map((s) => kit().pay.press(s.checkoutUrl, 'pay')));
    // Each completion delivered again, concurrently, on top of the service's own delivery.
    await Promise.all(sessions.map(async (s) => postEvent(t, signedEvent(kit(), 'checkout.session.completed', await kit().sdk.checkout.sessions.retrieve(s.id)))));
    for (const s of started) await waitForStatus(t, s.sessionId, 'paid');
    expect((await balanceOf(t)).available).toBe(before.available + 200);
    for (const s of started) expect(await purchases(s.sessionId)).toBe(1);
  });

  it('keeps trying while the API is down and credits once when it is back', async () => {
    const before = await balanceOf(t);
    const { sessionId, checkoutUrl } = await checkout(t, pack.id);
    await kit().stopListening();
    try {
      await kit().pay.press(checkoutUrl, 'pay');
      const events = await kit().pay.events('checkout.session.completed');
      const event = events.find((e) => e.data.object.id === sessionId)!;
      await eventually(async () => {
        const d = (await kit().pay.deliveries()).find((x) => x.id === event.id);
        return d && d.attempts >= 2 && d.state === 'pending';
      }, 15_000, 'two refused deliveries');
      expect(await paymentStatus(t, sessionId)).toBe('open');
    } finally {
      await kit().listenAgain();
    }
    await waitForStatus(t, sessionId, 'paid');
    await new Promise((r) => setTimeout(r, 1500));
    expect(await purchases(sessionId)).toBe(1);
    expect((await balanceOf(t)).available).toBe(before.available + 10);
  });
});
