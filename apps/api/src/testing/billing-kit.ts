// Shared set-up for the billing specs: the app on a real port and the local payment service beside it.
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import Stripe from 'stripe';
import type { TestApp } from './test-app';
import { eventually, startLocalPaymentService, type LocalPaymentService } from './payment-service';

export interface BillingKit {
  pay: LocalPaymentService;
  /** The SDK as a test uses it: against the same local payment service. */
  sdk: Stripe;
  port: number;
  /** Closes the API's listening socket (the webhook target goes down). */
  stopListening(): Promise<void>;
  /** Listens again on the same port. */
  listenAgain(): Promise<void>;
}

/** Serves the test app on a real port (the payment service posts webhooks to it) and starts the local payment service. */
export function useBillingKit(t: TestApp): { kit: () => BillingKit } {
  let kit: BillingKit | undefined;
  let server: Server | undefined;
  beforeAll(async () => {
    server = await new Promise<Server>((resolve) => {
      const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
    });
    const port = (server.address() as AddressInfo).port;
    const pay = await startLocalPaymentService(`http://127.0.0.1:${port}/api/payments/webhook`);
    const base = new URL(pay.url);
    const sdk = new Stripe('sk_test_ohmprint_local', { host: base.hostname, port: Number(base.port), protocol: 'http' });
    kit = {
      pay, sdk, port,
      stopListening: () => new Promise<void>((resolve) => {
        server!.closeAllConnections();
        server!.close(() => resolve());
      }),
      listenAgain: () => new Promise<void>((resolve, reject) => {
        server = t.app.listen(port, '127.0.0.1', () => resolve());
        server.once('error', reject);
      }),
    };
  });
  afterAll(async () => {
    await kit?.pay.close();
    if (server?.listening) await new Promise<void>((r) => server!.close(() => r()));
  });
  return { kit: () => kit! };
}

export async function createPack(t: TestApp, body: { name: string; credits: number; price: number; currency: string }, lab: 'calder' | 'marlow' = 'calder') {
  const res = await request(t.app).post('/api/lab/credit-packs').set(await t.authFor('lab-admin', lab)).send(body);
  if (res.status !== 201) throw new Error(`pack answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body as { id: string; paymentPriceId: string; paymentProductId: string; credits: number; price: number };
}

export async function balanceOf(t: TestApp, lab: 'calder' | 'marlow' = 'calder'): Promise<{ available: number; reserved: number }> {
  const res = await request(t.app).get('/api/client/credits').set(await t.authFor('client-admin', lab));
  return res.body;
}

export async function checkout(t: TestApp, packId: string, lab: 'calder' | 'marlow' = 'calder') {
  const res = await request(t.app).post('/api/client/credit-checkouts').set(await t.authFor('client-admin', lab)).send({ packId });
  if (res.status !== 201) throw new Error(`checkout answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body as { sessionId: string; checkoutUrl: string };
}

export async function paymentStatus(t: TestApp, sessionId: string): Promise<string> {
  const [row] = await t.db.query('SELECT status FROM payment WHERE checkout_session_id = $1', [sessionId]);
  return row?.status;
}

export const waitForStatus = (t: TestApp, sessionId: string, status: string) =>
  eventually(async () => (await paymentStatus(t, sessionId)) === status, 20_000, `payment ${sessionId} becoming ${status}`);

/** A signed event as the payment service would send it (for replays and forged orders of events). */
export function signedEvent(kit: BillingKit, type: string, object: unknown, id = `evt_test_${Math.random().toString(36).slice(2)}`) {
  const payload = JSON.stringify({ id, object: 'event', type, created: Math.floor(Date.now() / 1000), data: { object }, livemode: false, api_version: '2025-11-17.clover' });
  return { id, payload, signature: kit.sdk.webhooks.generateTestHeaderString({ payload, secret: kit.pay.webhookSecret }) };
}

export async function postEvent(t: TestApp, event: { payload: string; signature: string }) {
  return request(t.app).post('/api/payments/webhook').set('Content-Type', 'application/json').set('Stripe-Signature', event.signature).send(event.payload);
}
