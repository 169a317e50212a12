import type { EntityManager } from 'typeorm';
import type { CheckoutStarted } from '@ohmprint/contracts';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';
import type { CreditScope } from '../credits/credit-ledger';
import { ensurePaymentPrice, packOf } from './credit-packs';
import { PaymentRow } from './payment.entity';
import { paymentService, paymentServiceProblem } from './payment-service';

/**
 * The organisation's customer at the payment service, created once: the row lock makes concurrent
 * checkouts of one organisation wait for the first to create it, then reuse it.
 */
async function customerOf(manager: EntityManager, scope: CreditScope): Promise<string> {
  await manager.query(
    `INSERT INTO payment_customer (client_organisation_id, lab_id) SELECT id, lab_id FROM client_organisation WHERE id = $1 AND lab_id = $2
     ON CONFLICT (client_organisation_id) DO NOTHING`,
    [scope.clientOrganisationId, scope.labId],
  );
  const [row]: { customer_id: string | null; name: string }[] = await manager.query(
    `SELECT pc.customer_id, co.name FROM payment_customer pc JOIN client_organisation co ON co.id = pc.client_organisation_id
     WHERE pc.client_organisation_id = $1 AND pc.lab_id = $2 FOR UPDATE OF pc`,
    [scope.clientOrganisationId, scope.labId],
  );
  if (!row) throw ApiError.notFound('Client organisation');
  if (row.customer_id) return row.customer_id;
  const customer = await paymentService().customers.create({
    name: row.name, metadata: { ohmprint_client_organisation_id: scope.clientOrganisationId, ohmprint_lab_id: scope.labId },
  }, { idempotencyKey: `customer:${scope.clientOrganisationId}` });
  await manager.query('UPDATE payment_customer SET customer_id = $2 WHERE client_organisation_id = $1', [scope.clientOrganisationId, customer.id]);
  return customer.id;
}

/**
 * Starts a checkout for one pack: the pack's current price, the organisation's customer, metadata
 * naming our payment, organisation, lab and pack, and the portal's success and cancel pages. The
 * payment row (state `open`) is written in the same transaction, so a webhook only ever finds
 * sessions this API created.
 */
export async function startCheckout(manager: EntityManager, scope: CreditScope, userId: string, packId: string): Promise<CheckoutStarted> {
  const pack = await packOf(manager, scope.labId, packId);
  if (!pack.active) throw ApiError.conflict('This credit pack is no longer sold; choose another one.');
  const locked = await packOf(manager, scope.labId, packId, true);
  try {
    const priceId = await ensurePaymentPrice(manager, locked);
    const customer = await customerOf(manager, scope);
    const paymentId = (await manager.query('SELECT gen_random_uuid() AS id'))[0].id as string;
    const metadata = {
      ohmprint_payment_id: paymentId,
      ohmprint_client_organisation_id: scope.clientOrganisationId,
      ohmprint_lab_id: scope.labId,
      ohmprint_pack_id: pack.id,
    };
    const base = config.publicBaseUrl;
    const session = await paymentService().checkout.sessions.create({
      mode: 'payment',
      customer,
      line_items: [{ price: priceId, quantity: 1 }],
      client_reference_id: paymentId,
      metadata,
      payment_intent_data: { metadata },
      success_url: `${base}/credits/bought?session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${base}/credits/not-bought?session={CHECKOUT_SESSION_ID}`,
    }, { idempotencyKey: `checkout:${paymentId}` });
    if (!session.url) throw new Error('the payment service answered a checkout without a URL');
    await manager.insert(PaymentRow, {
      id: paymentId, labId: scope.labId, clientOrganisationId: scope.clientOrganisationId, creditPackId: pack.id,
      packName: locked.name, credits: locked.credits, amountMinor: String(session.amount_total ?? locked.priceMinor), currency: session.currency ?? locked.currency,
      priceId, checkoutSessionId: session.id, startedByUserId: userId,
    });
    return { sessionId: session.id, checkoutUrl: session.url.replace('{CHECKOUT_SESSION_ID}', session.id) };
  } catch (err) {
    throw paymentServiceProblem(err, 'starting the checkout');
  }
}

/** The client walked away (cancel page): the checkout is expired so it cannot be paid later by accident. */
export async function abandonCheckout(scope: CreditScope, manager: EntityManager, sessionId: string): Promise<void> {
  const payment = await manager.findOne(PaymentRow, { where: { labId: scope.labId, clientOrganisationId: scope.clientOrganisationId, checkoutSessionId: sessionId } });
  if (!payment) throw ApiError.notFound('Checkout');
  if (payment.status !== 'open' && payment.status !== 'declined') return;
  try {
    const session = await paymentService().checkout.sessions.retrieve(sessionId);
    if (session.status === 'open') await paymentService().checkout.sessions.expire(sessionId);
  } catch (err) {
    throw paymentServiceProblem(err, 'closing the checkout');
  }
}
