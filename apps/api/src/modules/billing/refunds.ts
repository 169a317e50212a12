import type { EntityManager } from 'typeorm';
import { PAYMENT_STATE_WORDS, type Payment, type PaymentState } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { creditBalance, removeCredits } from '../credits/credit-ledger';
import { PaymentRow } from './payment.entity';
import { paymentService, paymentServiceProblem } from './payment-service';
import { labPayment } from './views';

/**
 * Refunds a paid checkout whose credits are still unused: the organisation must still hold at least
 * the pack's credits as available (credits reserved for orders or spent on reports cannot be taken
 * back). Credits leave the ledger first, then the payment service refunds; if it refuses, the whole
 * transaction rolls back and nothing has changed.
 */
export async function refundPayment(manager: EntityManager, labId: string, actorUserId: string, paymentId: string): Promise<Payment> {
  const payment = await manager.findOne(PaymentRow, { where: { id: paymentId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!payment) throw ApiError.notFound('Payment');
  if (payment.status === 'refunded') throw new ApiError(409, 'Already refunded', 'This payment was refunded already.', { type: 'already-refunded' });
  if (payment.status !== 'paid') {
    throw new ApiError(409, 'Nothing to refund', `This payment was not completed (${PAYMENT_STATE_WORDS[payment.status as PaymentState].toLowerCase()}), so no money was taken and there is nothing to refund.`, { type: 'not-paid' });
  }
  if (payment.isDemo || !payment.paymentIntentId) {
    throw new ApiError(409, 'Not refundable here', 'This payment has no record at the payment service (invented demo data); adjust the credits instead.', { type: 'not-at-payment-service' });
  }
  const scope = { labId, clientOrganisationId: payment.clientOrganisationId };
  const { available, reserved } = await creditBalance(manager, scope);
  if (available < payment.credits) {
    throw new ApiError(409, 'Credits already used',
      `This payment added ${payment.credits} credits, but the organisation has only ${available} available (${reserved} held for open orders; the rest spent on reports). ` +
      'Credits already reserved or spent cannot be refunded; a manual adjustment can settle a partial refund.',
      { type: 'credits-in-use', extensions: { credits: payment.credits, available, reserved } });
  }
  await removeCredits(manager, scope, payment.credits, 'refund', { reason: `Refund of ${payment.packName}`, actorUserId, paymentId: payment.id });
  let refundId: string;
  try {
    const refund = await paymentService().refunds.create({ payment_intent: payment.paymentIntentId, metadata: { ohmprint_payment_id: payment.id } },
      { idempotencyKey: `refund:${payment.id}` });
    refundId = refund.id;
  } catch (err) {
    throw paymentServiceProblem(err, 'refunding the payment');
  }
  await manager.update(PaymentRow, { id: payment.id }, { status: 'refunded', refundedAt: new Date(), refundedByUserId: actorUserId, refundId });
  await recordAudit(manager, { labId, actorUserId, action: 'payment.refunded', subjectType: 'payment', subjectId: payment.id,
    details: { clientOrganisationId: payment.clientOrganisationId, credits: payment.credits, amount: Number(payment.amountMinor), currency: payment.currency, refundId } });
  return labPayment(manager, labId, payment.id);
}
