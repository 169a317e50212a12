// The /v1 wire API the official SDK calls: products, prices, customers, checkout sessions,
// payment intents and refunds. Bodies are form-encoded with bracketed keys, answers are JSON objects.
import express from 'express';
import { bool, list, mergeMetadata, missing, newId, now, required, WireError, wholeNumber } from './store.mjs';

const CURRENCY = /^[a-z]{3}$/;

function currencyOf(value) {
  const c = String(required(value, 'currency')).toLowerCase();
  if (!CURRENCY.test(c)) throw new WireError(400, `Invalid currency: ${value}`, { param: 'currency' });
  return c;
}

export function createApiRouter({ store, webhooks, checkoutBase }) {
  const router = express.Router();
  router.use(express.urlencoded({ extended: true, limit: '100kb', parameterLimit: 2000 }));

  // Any secret key opens the fake (the hosted service checks it; here only its presence and shape).
  router.use((req, _res, next) => {
    const auth = req.get('authorization') ?? '';
    if (!/^Bearer sk_(test|live)_\S+$/.test(auth)) {
      return next(new WireError(401, 'You did not provide a valid API key.', { type: 'invalid_request_error' }));
    }
    next();
  });

  // Idempotency keys: the same key answers the same result (the SDK sends one with every POST).
  const replies = new Map();
  router.use((req, res, next) => {
    const key = req.get('idempotency-key');
    if (req.method !== 'POST' || !key) return next();
    const seen = replies.get(`${req.path} ${key}`);
    if (seen) return res.status(seen.status).set('idempotent-replayed', 'true').json(seen.body);
    const json = res.json.bind(res);
    res.json = (body) => {
      replies.set(`${req.path} ${key}`, { status: res.statusCode, body });
      return json(body);
    };
    next();
  });

  const found = (type, id, label = type) => {
    const obj = store.get(type, id);
    if (!obj) throw missing(label, id);
    return obj;
  };

  // Products
  router.post('/products', (req, res) => {
    const b = req.body;
    res.json(store.put('product', {
      id: b.id ?? newId('prod'), object: 'product', active: bool(b.active, true), created: now(), updated: now(),
      name: required(b.name, 'name'), description: b.description ?? null, metadata: mergeMetadata({}, b.metadata), livemode: false,
      default_price: null, images: [], type: 'service', url: null,
    }));
  });
  router.get('/products/:id', (req, res) => res.json(found('product', req.params.id)));
  router.post('/products/:id', (req, res) => {
    const p = found('product', req.params.id);
    const b = req.body;
    if (b.name !== undefined) p.name = required(b.name, 'name');
    if (b.description !== undefined) p.description = b.description || null;
    p.active = bool(b.active, p.active);
    p.metadata = mergeMetadata(p.metadata, b.metadata);
    p.updated = now();
    res.json(p);
  });
  router.get('/products', (req, res) => res.json(list(store.all('product').reverse(), req.query, '/v1/products')));

  // Prices (immutable amounts: only `active`, `nickname` and metadata change)
  router.post('/prices', (req, res) => {
    const b = req.body;
    const product = found('product', required(b.product, 'product'), 'product');
    res.json(store.put('price', {
      id: newId('price'), object: 'price', active: bool(b.active, true), billing_scheme: 'per_unit', created: now(),
      currency: currencyOf(b.currency), livemode: false, lookup_key: null, metadata: mergeMetadata({}, b.metadata),
      nickname: b.nickname ?? null, product: product.id, recurring: null, tax_behavior: 'unspecified', type: 'one_time',
      unit_amount: wholeNumber(b.unit_amount, 'unit_amount'), unit_amount_decimal: String(b.unit_amount),
    }));
  });
  router.get('/prices/:id', (req, res) => res.json(found('price', req.params.id)));
  router.post('/prices/:id', (req, res) => {
    const p = found('price', req.params.id);
    const b = req.body;
    if (b.unit_amount !== undefined || b.currency !== undefined) {
      throw new WireError(400, 'Received unknown parameter: unit_amount. Prices cannot be changed; create a new price.', { param: 'unit_amount' });
    }
    p.active = bool(b.active, p.active);
    if (b.nickname !== undefined) p.nickname = b.nickname || null;
    p.metadata = mergeMetadata(p.metadata, b.metadata);
    res.json(p);
  });
  router.get('/prices', (req, res) => {
    let items = store.all('price').reverse();
    if (req.query.product) items = items.filter((p) => p.product === req.query.product);
    if (req.query.active !== undefined) items = items.filter((p) => p.active === bool(req.query.active));
    res.json(list(items, req.query, '/v1/prices'));
  });

  // Customers
  router.post('/customers', (req, res) => {
    const b = req.body;
    res.json(store.put('customer', {
      id: newId('cus'), object: 'customer', created: now(), email: b.email ?? null, name: b.name ?? null,
      description: b.description ?? null, metadata: mergeMetadata({}, b.metadata), livemode: false, currency: null, deleted: undefined,
    }));
  });
  router.get('/customers/:id', (req, res) => res.json(found('customer', req.params.id)));
  router.post('/customers/:id', (req, res) => {
    const c = found('customer', req.params.id);
    const b = req.body;
    if (b.email !== undefined) c.email = b.email || null;
    if (b.name !== undefined) c.name = b.name || null;
    c.metadata = mergeMetadata(c.metadata, b.metadata);
    res.json(c);
  });

  // Checkout sessions (mode payment, one-time prices)
  router.post('/checkout/sessions', (req, res) => {
    const b = req.body;
    if (b.mode !== 'payment') throw new WireError(400, 'This local service only runs checkout sessions in mode "payment".', { param: 'mode' });
    required(b.success_url, 'success_url');
    const items = Array.isArray(b.line_items) ? b.line_items : Object.values(b.line_items ?? {});
    if (!items.length) throw new WireError(400, 'Missing required param: line_items.', { param: 'line_items' });
    const lineItems = items.map((item, i) => {
      const price = found('price', required(item.price, `line_items[${i}][price]`), 'price');
      if (!price.active) throw new WireError(400, `The price specified (${price.id}) is inactive. This field only accepts active prices.`, { param: `line_items[${i}][price]` });
      const quantity = wholeNumber(item.quantity ?? 1, `line_items[${i}][quantity]`, { min: 1 });
      const amount = price.unit_amount * quantity;
      return { id: newId('li'), object: 'item', amount_subtotal: amount, amount_total: amount, currency: price.currency,
        description: store.get('product', price.product)?.name ?? '', price, quantity };
    });
    const currency = lineItems[0].currency;
    if (lineItems.some((l) => l.currency !== currency)) throw new WireError(400, 'All line items must share one currency.', { param: 'line_items' });
    const customer = b.customer ? found('customer', b.customer, 'customer').id : null;
    const id = newId('cs_test');
    const total = lineItems.reduce((s, l) => s + l.amount_total, 0);
    const session = store.put('checkout_session', {
      id, object: 'checkout.session', amount_subtotal: total, amount_total: total, cancel_url: b.cancel_url ?? null,
      client_reference_id: b.client_reference_id ?? null, created: now(), currency, customer,
      customer_email: b.customer_email ?? null, expires_at: now() + 24 * 3600, livemode: false, metadata: mergeMetadata({}, b.metadata),
      mode: 'payment', payment_intent: null, payment_status: 'unpaid', status: 'open', success_url: b.success_url,
      url: `${checkoutBase}/checkout/${id}`,
    });
    store.put('session_items', { id, items: lineItems, paymentIntentMetadata: mergeMetadata({}, b.payment_intent_data?.metadata) });
    res.json(session);
  });
  router.get('/checkout/sessions/:id', (req, res) => res.json(found('checkout_session', req.params.id, 'checkout.session')));
  router.get('/checkout/sessions/:id/line_items', (req, res) => {
    found('checkout_session', req.params.id, 'checkout.session');
    res.json(list(store.get('session_items', req.params.id).items, req.query, `/v1/checkout/sessions/${req.params.id}/line_items`));
  });
  router.post('/checkout/sessions/:id/expire', (req, res) => {
    const s = found('checkout_session', req.params.id, 'checkout.session');
    if (s.status !== 'open') throw new WireError(400, `Only open Checkout Sessions can be expired. This session is ${s.status}.`, { code: 'checkout_session_not_open' });
    expireSession(store, webhooks, s);
    res.json(s);
  });
  router.get('/checkout/sessions', (req, res) => {
    let items = store.all('checkout_session').reverse();
    if (req.query.customer) items = items.filter((s) => s.customer === req.query.customer);
    if (req.query.payment_intent) items = items.filter((s) => s.payment_intent === req.query.payment_intent);
    res.json(list(items, req.query, '/v1/checkout/sessions'));
  });

  // Payment intents (created by the test checkout page) and refunds
  router.get('/payment_intents/:id', (req, res) => res.json(found('payment_intent', req.params.id, 'payment_intent')));
  router.post('/refunds', (req, res) => {
    const b = req.body;
    let intent;
    if (b.payment_intent) intent = found('payment_intent', b.payment_intent, 'payment_intent');
    else if (b.charge) intent = store.all('payment_intent').find((pi) => pi.latest_charge === b.charge) ?? (() => { throw missing('charge', b.charge); })();
    else throw new WireError(400, 'Missing required param: payment_intent.', { param: 'payment_intent' });
    if (intent.status !== 'succeeded') throw new WireError(400, `PaymentIntent ${intent.id} has not succeeded; nothing to refund.`, { code: 'charge_not_refundable' });
    const charge = store.get('charge', intent.latest_charge);
    const left = charge.amount - charge.amount_refunded;
    const amount = b.amount === undefined ? left : wholeNumber(b.amount, 'amount', { min: 1 });
    if (amount > left) throw new WireError(400, `Refund amount (${amount}) is greater than unrefunded amount on charge (${left})`, { code: 'amount_too_large', param: 'amount' });
    const refund = store.put('refund', {
      id: newId('re'), object: 'refund', amount, charge: charge.id, created: now(), currency: charge.currency,
      metadata: mergeMetadata({}, b.metadata), payment_intent: intent.id, reason: b.reason ?? null, status: 'succeeded',
    });
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded === charge.amount;
    webhooks.emit('refund.created', refund);
    webhooks.emit('charge.refunded', charge);
    res.json(refund);
  });
  router.get('/refunds/:id', (req, res) => res.json(found('refund', req.params.id, 'refund')));

  router.use((req) => {
    throw new WireError(404, `Unrecognized request URL (${req.method}: ${req.originalUrl}). This local payment service covers products, prices, customers, checkout sessions, payment intents and refunds.`);
  });
  return router;
}

export function expireSession(store, webhooks, session) {
  session.status = 'expired';
  session.url = null;
  webhooks.emit('checkout.session.expired', session);
}

function newIntent(store, session, status, extra = {}) {
  const meta = store.get('session_items', session.id).paymentIntentMetadata;
  return store.put('payment_intent', {
    id: newId('pi'), object: 'payment_intent', amount: session.amount_total, amount_received: 0, created: now(),
    currency: session.currency, customer: session.customer, latest_charge: null, livemode: false, metadata: { ...meta },
    payment_method_types: ['card'], status, last_payment_error: null, ...extra,
  });
}

/** The test page's Pay button: the session completes paid and the events go out. */
export function paySession(store, webhooks, session) {
  const intent = store.get('payment_intent', session.payment_intent) ?? newIntent(store, session, 'processing');
  const charge = store.put('charge', {
    id: newId('ch'), object: 'charge', amount: intent.amount, amount_refunded: 0, captured: true, created: now(),
    currency: intent.currency, customer: intent.customer, paid: true, payment_intent: intent.id, refunded: false, status: 'succeeded',
  });
  Object.assign(intent, { status: 'succeeded', amount_received: intent.amount, latest_charge: charge.id, last_payment_error: null });
  Object.assign(session, { status: 'complete', payment_status: 'paid', payment_intent: intent.id, url: null });
  webhooks.emit('payment_intent.succeeded', intent);
  webhooks.emit('charge.succeeded', charge);
  webhooks.emit('checkout.session.completed', session);
}

/** The test page's Decline button: the card is refused, the session stays open for another try. */
export function declineSession(store, webhooks, session) {
  const error = { type: 'card_error', code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined. (local test decline)' };
  let intent = store.get('payment_intent', session.payment_intent);
  if (intent) Object.assign(intent, { status: 'requires_payment_method', last_payment_error: error });
  else intent = newIntent(store, session, 'requires_payment_method', { last_payment_error: error });
  session.payment_intent = intent.id;
  webhooks.emit('payment_intent.payment_failed', intent);
}
