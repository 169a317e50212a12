import type Stripe from 'stripe';
import type { DataSource, EntityManager } from 'typeorm';
import { ApiError } from '../../core/api-error';
import { logger } from '../../core/logger';
import { addCredits } from '../credits/credit-ledger';
import { PaymentRow } from './payment.entity';
import { paymentService, paymentServiceProblem, webhookSecret } from './payment-service';
import { enqueueReceipt } from './receipt-email';

/** Checks the signature on the raw body; 400 when it does not match (tampered, wrong secret, too old). */
export function verifiedEvent(rawBody: Buffer, signature: string | undefined): Stripe.Event {
  if (!signature) throw ApiError.badRequest('The Stripe-Signature header is missing.', [{ field: 'Stripe-Signature', message: 'is required' }]);
  try {
    return paymentService().webhooks.constructEvent(rawBody, signature, webhookSecret());
  } catch (err) {
    if (err instanceof ApiError) throw err;
    throw new ApiError(400, 'Signature does not match', 'The payment notification’s signature does not match its body; it was ignored.',
      { type: 'bad-webhook-signature', errors: [{ field: 'Stripe-Signature', message: (err as Error).message.slice(0, 200) }] });
  }
}

async function lockedPayment(manager: EntityManager, where: { checkoutSessionId?: string; id?: string }): Promise<PaymentRow | null> {
  return manager.findOne(PaymentRow, { where, lock: { mode: 'pessimistic_write' } });
}

/**
 * A paid checkout adds the pack's credits once. The event is only a hint: the session is read back
 * from the payment service and must be ours (metadata), complete, paid, and for the amount we asked.
 */
async function checkoutCompleted(manager: EntityManager, sessionId: string): Promise<string> {
  const payment = await lockedPayment(manager, { checkoutSessionId: sessionId });
  if (!payment) return 'unknown-session';
  if (payment.status === 'paid' || payment.status === 'refunded') return 'already-credited';
  let session: Stripe.Checkout.Session;
  try {
    session = await paymentService().checkout.sessions.retrieve(sessionId);
  } catch (err) {
    if ((err as { statusCode?: number }).statusCode === 404) return 'session-not-at-payment-service';
    throw paymentServiceProblem(err, 'confirming the checkout');
  }
  const m = session.metadata ?? {};
  if (m.ohmprint_payment_id !== payment.id || m.ohmprint_client_organisation_id !== payment.clientOrganisationId || m.ohmprint_lab_id !== payment.labId) {
    logger.warn({ sessionId }, 'checkout metadata does not match the payment; nothing credited');
    return 'metadata-mismatch';
  }
  if (session.status !== 'complete' || session.payment_status !== 'paid') return 'not-paid';
  if (session.amount_total !== Number(payment.amountMinor) || session.currency !== payment.currency) {
    logger.warn({ sessionId, amount: session.amount_total, expected: payment.amountMinor }, 'checkout amount differs from the payment; nothing credited');
    return 'amount-mismatch';
  }
  const paidAt = new Date();
  const intentId = typeof session.payment_intent === 'string' ? session.payment_intent : session.payment_intent?.id ?? null;
  await manager.update(PaymentRow, { id: payment.id }, { status: 'paid', paidAt, paymentIntentId: intentId, failureMessage: null });
  const balance = await addCredits(manager, { labId: payment.labId, clientOrganisationId: payment.clientOrganisationId }, payment.credits, 'purchase', {
    reason: `Bought ${payment.packName}`, actorUserId: payment.startedByUserId, paymentId: payment.id,
  });
  await enqueueReceipt(manager, { ...payment, status: 'paid', paidAt, paymentIntentId: intentId }, balance.available);
  return 'credited';
}

async function checkoutExpired(manager: EntityManager, sessionId: string): Promise<string> {
  const payment = await lockedPayment(manager, { checkoutSessionId: sessionId });
  if (!payment) return 'unknown-session';
  if (payment.status !== 'open' && payment.status !== 'declined') return `ignored-${payment.status}`;
  await manager.update(PaymentRow, { id: payment.id }, { status: 'expired' });
  return 'expired';
}

async function paymentFailed(manager: EntityManager, intent: Stripe.PaymentIntent): Promise<string> {
  const id = intent.metadata?.ohmprint_payment_id;
  if (!id || !/^[0-9a-f-]{36}$/i.test(id)) return 'unknown-payment';
  const payment = await lockedPayment(manager, { id });
  if (!payment || payment.labId !== intent.metadata.ohmprint_lab_id) return 'unknown-payment';
  if (payment.status !== 'open' && payment.status !== 'declined') return `ignored-${payment.status}`;
  const message = (intent.last_payment_error?.message ?? 'The card was declined.').slice(0, 300);
  await manager.update(PaymentRow, { id: payment.id }, { status: 'declined', failureMessage: message, paymentIntentId: intent.id });
  return 'declined';
}

/**
 * Handles one verified event exactly once: the event id is recorded in the same transaction as its
 * effect (a replay finds it and does nothing), and a session credits once (its payment row is
 * locked and moves forward only; one purchase ledger entry per payment is also a unique index).
 * A failure rolls both back, so the payment service delivers the event again.
 */
export async function handlePaymentEvent(dataSource: DataSource, event: Stripe.Event): Promise<string> {
  return dataSource.transaction(async (manager) => {
    const object = event.data.object as { id?: string; object?: string };
    const sessionId = object.object === 'checkout.session' ? object.id ?? null : null;
    const claimed: { event_id: string }[] = await manager.query(
      `INSERT INTO payment_webhook_event (event_id, type, checkout_session_id, outcome) VALUES ($1, $2, $3, 'handling')
       ON CONFLICT (event_id) DO NOTHING RETURNING event_id`,
      [event.id.slice(0, 255), event.type.slice(0, 100), sessionId?.slice(0, 255) ?? null],
    );
    if (!claimed.length) return 'duplicate-event';
    let outcome: string;
    switch (event.type) {
      case 'checkout.session.completed':
      case 'checkout.session.async_payment_succeeded':
        outcome = await checkoutCompleted(manager, sessionId!);
        break;
      case 'checkout.session.expired':
        outcome = await checkoutExpired(manager, sessionId!);
        break;
      case 'payment_intent.payment_failed':
        outcome = await paymentFailed(manager, event.data.object as Stripe.PaymentIntent);
        break;
      default:
        outcome = 'not-needed';
    }
    await manager.query('UPDATE payment_webhook_event SET outcome = $2 WHERE event_id = $1', [event.id, outcome]);
    return outcome;
  });
}
