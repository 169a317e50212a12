import Stripe from 'stripe';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';

/** Where the SDK talks to and how webhooks are verified. */
export interface PaymentSettings {
  /** The local payment service's base URL; undefined for the hosted service. */
  apiBase?: string;
  secretKey: string;
  webhookSecret?: string;
}

let settings: PaymentSettings = { ...config.payments };
let client: Stripe | undefined;

/** The official SDK, pointed at the local payment service when `STRIPE_API_BASE` is set. */
export function paymentService(): Stripe {
  if (!client) {
    const base = settings.apiBase ? new URL(settings.apiBase) : undefined;
    client = new Stripe(settings.secretKey, {
      maxNetworkRetries: 2,
      timeout: 15_000,
      ...(base ? { host: base.hostname, port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)), protocol: base.protocol.replace(':', '') as 'http' | 'https' } : {}),
    });
  }
  return client;
}

export function webhookSecret(): string {
  if (!settings.webhookSecret) throw new ApiError(503, 'Payments not set up', 'PAYMENT_WEBHOOK_SECRET is not set, so payment notifications cannot be checked.', { type: 'payments-not-configured' });
  return settings.webhookSecret;
}

/** Tests point the API at the payment service they started (its own port and secret). */
export function usePaymentSettings(next: Partial<PaymentSettings>): void {
  settings = { ...settings, ...next };
  client = undefined;
}

/** A payment-service failure as a problem the caller can act on (never a bare 500). */
export function paymentServiceProblem(err: unknown, doing: string): ApiError {
  if (err instanceof ApiError) return err;
  const e = err as { type?: string; message?: string; statusCode?: number };
  if (e?.type === 'StripeConnectionError' || e?.type === 'StripeAPIError' || !e?.statusCode) {
    return new ApiError(502, 'Payment service unreachable', `The payment service did not answer while ${doing}; nothing was charged. Try again in a moment.`, { type: 'payment-service-unavailable' });
  }
  return new ApiError(502, 'Payment service refused', `The payment service refused ${doing}: ${e.message ?? 'no reason given'}.`, { type: 'payment-service-refused' });
}
