// The local payment service: the /v1 wire API, the test checkout page and webhook delivery, on
// loopback only. `startPaymentService()` is what docker-free-scripts/payment-fake.mjs runs.
import express from 'express';
import { createApiRouter, expireSession } from './api.mjs';
import { createCheckoutPage } from './checkout-page.mjs';
import { createStore, WireError } from './store.mjs';
import { createWebhooks } from './webhooks.mjs';

export async function startPaymentService({ port = 12111, webhookUrl, webhookSecret, retryBaseMs = 1000, log = console.log }) {
  if (!webhookSecret) throw new Error('the payment service needs a webhook secret (PAYMENT_WEBHOOK_SECRET)');
  const store = createStore();
  const app = express();
  app.disable('x-powered-by');
  const server = await new Promise((resolve, reject) => {
    const s = app.listen(port, '127.0.0.1', () => resolve(s));
    s.on('error', reject);
  });
  const base = `http://127.0.0.1:${server.address().port}`;
  const webhooks = createWebhooks({ store, url: webhookUrl, secret: webhookSecret, retryBaseMs, log });

  // Loopback only, also behind a forwarder: the page and the API are for this machine.
  app.use((req, res, next) => {
    const ip = req.socket.remoteAddress ?? '';
    if (ip === '127.0.0.1' || ip === '::1' || ip === '::ffff:127.0.0.1') return next();
    res.status(403).type('text').send('The local payment service answers on loopback only.');
  });
  app.use('/v1', createApiRouter({ store, webhooks, checkoutBase: base }));
  app.use(createCheckoutPage({ store, webhooks }));
  // Delivery state, for a person or a test waiting on a webhook.
  app.get('/local/deliveries', (_req, res) => res.json(store.all('delivery')));
  app.get('/local/events', (req, res) => res.json(store.all('event').filter((e) => !req.query.type || e.type === req.query.type)));
  app.post('/local/events/:id/resend', (req, res) => {
    const event = webhooks.resend(req.params.id);
    if (!event) return res.status(404).json({ error: { type: 'invalid_request_error', message: `No such event: '${req.params.id}'` } });
    res.json(event);
  });
  app.get('/', (_req, res) => res.type('text').send(`Local payment service (test only). Webhooks go to ${webhookUrl}.`));

  // Sessions left open past `expires_at` expire, as the hosted service does.
  const sweep = setInterval(() => {
    const t = Math.floor(Date.now() / 1000);
    for (const s of store.all('checkout_session')) if (s.status === 'open' && s.expires_at <= t) expireSession(store, webhooks, s);
  }, 30_000);
  sweep.unref();

  // eslint-disable-next-line no-unused-vars
  app.use((err, _req, res, _next) => {
    if (err instanceof WireError) return res.status(err.status).json(err.body);
    if (err?.type === 'entity.too.large' || err?.type === 'entity.parse.failed' || err?.status === 400) {
      return res.status(400).json({ error: { type: 'invalid_request_error', message: String(err.message) } });
    }
    log(`payment service error: ${err?.stack ?? err}`);
    res.status(500).json({ error: { type: 'api_error', message: 'The local payment service failed; see its log.' } });
  });

  return {
    url: base,
    port: server.address().port,
    store,
    async close() {
      clearInterval(sweep);
      webhooks.stop();
      server.closeAllConnections?.();
      await new Promise((r) => server.close(() => r()));
    },
  };
}
