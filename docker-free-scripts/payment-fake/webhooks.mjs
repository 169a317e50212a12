// Events and signed webhook delivery. Each event goes to the one configured endpoint; a refused or
// unreachable delivery is tried again with a doubling delay (the hosted service does the same over
// days; here the first retry comes after `retryBaseMs`), re-signed with a fresh timestamp each time.
import { newId, now } from './store.mjs';
import { signatureHeader } from './signature.mjs';

export const API_VERSION = '2025-11-17.clover';

export function createWebhooks({ store, url, secret, retryBaseMs = 1000, retryMaxMs = 5 * 60_000, maxAttempts = 25, log = () => {} }) {
  const timers = new Set();
  let stopped = false;

  async function attempt(event, delivery) {
    delivery.attempts += 1;
    const payload = JSON.stringify(event, null, 2);
    try {
      const res = await fetch(url, {
        method: 'POST',
        headers: {
          'content-type': 'application/json; charset=utf-8',
          'stripe-signature': signatureHeader(payload, secret),
          'user-agent': 'ohmprint-local-payment-service',
        },
        body: payload,
        signal: AbortSignal.timeout(20_000),
      });
      await res.arrayBuffer().catch(() => undefined);
      delivery.lastStatus = res.status;
      if (res.ok) {
        delivery.state = 'delivered';
        event.pending_webhooks = 0;
        log(`delivered ${event.type} ${event.id} (attempt ${delivery.attempts}, ${res.status})`);
        return;
      }
    } catch (err) {
      delivery.lastStatus = null;
      delivery.lastError = err?.cause?.code ?? err?.message ?? String(err);
    }
    if (stopped || delivery.attempts >= maxAttempts) {
      delivery.state = 'failed';
      log(`gave up on ${event.type} ${event.id} after ${delivery.attempts} attempts`);
      return;
    }
    const delay = Math.min(retryBaseMs * 2 ** (delivery.attempts - 1), retryMaxMs);
    delivery.nextAttemptAt = Date.now() + delay;
    log(`${event.type} ${event.id} not accepted (${delivery.lastStatus ?? delivery.lastError}); next try in ${delay} ms`);
    const timer = setTimeout(() => {
      timers.delete(timer);
      void attempt(event, delivery);
    }, delay);
    timers.add(timer);
  }

  return {
    /** Records an event about `object` and starts delivering it. */
    emit(type, object) {
      const event = store.put('event', {
        id: newId('evt'),
        object: 'event',
        api_version: API_VERSION,
        created: now(),
        data: { object: structuredClone(object) },
        livemode: false,
        pending_webhooks: 1,
        request: { id: null, idempotency_key: null },
        type,
      });
      const delivery = { state: 'pending', attempts: 0, lastStatus: null, lastError: null, nextAttemptAt: Date.now() };
      store.put('delivery', { id: event.id, ...delivery });
      const tracked = store.get('delivery', event.id);
      void attempt(event, tracked);
      return event;
    },
    /** Delivers an event already sent once again (what the dashboard's "resend" does). */
    resend(eventId) {
      const event = store.get('event', eventId);
      if (!event) return null;
      const delivery = store.get('delivery', eventId);
      delivery.state = 'pending';
      void attempt(event, delivery);
      return event;
    },
    stop() {
      stopped = true;
      for (const t of timers) clearTimeout(t);
      timers.clear();
    },
  };
}
