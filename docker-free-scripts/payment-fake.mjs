// Local stand-in for the hosted payment service, on loopback only (docker-free-scripts/payment-fake/).
// The real `stripe` SDK talks to it when STRIPE_API_BASE points here; the hosted service needs no API
// base at all (see the README's "Payments" section).
//   node docker-free-scripts/payment-fake.mjs [port]
// Environment: PAYMENT_WEBHOOK_SECRET (required), PAYMENT_WEBHOOK_URL (default
// http://127.0.0.1:$PORT/api/payments/webhook), PAYMENT_WEBHOOK_RETRY_MS (first retry delay, default 1000).
import { startPaymentService } from './payment-fake/server.mjs';

const port = Number(process.argv[2] ?? process.env.OHMPRINT_PAYMENT_FAKE_PORT ?? 12111);
const webhookUrl = process.env.PAYMENT_WEBHOOK_URL || `http://127.0.0.1:${process.env.PORT || 4300}/api/payments/webhook`;
const service = await startPaymentService({
  port,
  webhookUrl,
  webhookSecret: process.env.PAYMENT_WEBHOOK_SECRET,
  retryBaseMs: Number(process.env.PAYMENT_WEBHOOK_RETRY_MS ?? 1000),
});
console.log(`payment fake on ${service.url} (webhooks to ${webhookUrl})`);
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => void service.close().then(() => process.exit(0)));
