import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import { usePaymentSettings } from '../modules/billing/payment-service';

const SCRIPT = join(__dirname, '..', '..', '..', '..', 'docker-free-scripts', 'payment-fake.mjs');

export interface LocalPaymentService {
  /** Base URL (the SDK's API base and the test checkout pages). */
  readonly url: string;
  readonly webhookSecret: string;
  /** Webhook deliveries: `{ id (event id), state, attempts, lastStatus }`. */
  deliveries(): Promise<{ id: string; state: string; attempts: number; lastStatus: number | null }[]>;
  events(type?: string): Promise<{ id: string; type: string; data: { object: { id: string } } }[]>;
  resend(eventId: string): Promise<void>;
  /** Presses a button on the test checkout page: `pay` or `decline`. Answers the HTTP status. */
  press(checkoutUrl: string, button: 'pay' | 'decline'): Promise<number>;
  close(): Promise<void>;
}

/**
 * Starts docker-free-scripts/payment-fake.mjs as a child process on a free port, delivering signed
 * webhooks to `webhookUrl` with `retryMs` as the first retry delay, and points the API's SDK at it.
 */
export async function startLocalPaymentService(webhookUrl: string, retryMs = 200): Promise<LocalPaymentService> {
  const webhookSecret = `whsec_test_${randomBytes(18).toString('hex')}`;
  const child: ChildProcess = spawn(process.execPath, [SCRIPT, '0'], {
    env: { ...process.env, PAYMENT_WEBHOOK_SECRET: webhookSecret, PAYMENT_WEBHOOK_URL: webhookUrl, PAYMENT_WEBHOOK_RETRY_MS: String(retryMs) },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const url = await new Promise<string>((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`the payment service did not start: ${out}`)), 15_000);
    child.stdout!.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      const m = /payment fake on (http:\/\/127\.0\.0\.1:\d+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve(m[1]);
      }
    });
    child.stderr!.on('data', (chunk: Buffer) => (out += chunk.toString()));
    child.on('exit', (code) => reject(new Error(`the payment service exited (${code}): ${out}`)));
  });
  child.stdout!.resume();
  usePaymentSettings({ apiBase: url, webhookSecret, secretKey: 'sk_test_ohmprint_local' });
  const json = async <T>(path: string, init?: RequestInit): Promise<T> => {
    const res = await fetch(`${url}${path}`, init);
    if (!res.ok) throw new Error(`${path} answered ${res.status}`);
    return (await res.json()) as T;
  };
  return {
    url,
    webhookSecret,
    deliveries: () => json('/local/deliveries'),
    events: (type) => json(`/local/events${type ? `?type=${encodeURIComponent(type)}` : ''}`),
    resend: async (id) => void (await json(`/local/events/${id}/resend`, { method: 'POST' })),
    async press(checkoutUrl, button) {
      const res = await fetch(`${checkoutUrl}/${button}`, { method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: '' });
      await res.arrayBuffer();
      return res.status;
    },
    async close() {
      if (child.exitCode !== null) return;
      await new Promise<void>((resolve) => {
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      });
    },
  };
}

/** Polls `probe` until it answers truthy (webhooks arrive asynchronously), or fails after `ms`. */
export async function eventually<T>(probe: () => Promise<T>, ms = 15_000, what = 'the condition'): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > until) throw new Error(`${what} did not come true within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
