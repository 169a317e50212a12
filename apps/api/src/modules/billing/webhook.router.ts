import express, { type Router } from 'express';
import { WebhookAnswerSchema } from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { dataSource } from '../../db/data-source';
import { handlePaymentEvent, verifiedEvent } from './webhook';

/**
 * The payment service's notifications. Mounted before the JSON body parser: the signature covers
 * the exact bytes, so the body is read raw here.
 */
export function paymentWebhookRouter(): Router {
  const { router, route } = routeTable();
  route({ method: 'post', path: '/payments/webhook', tag: 'Payments', requestMediaType: 'application/json',
    summary: 'Payment service events, signed (`Stripe-Signature`); 400 when the signature does not match. Each event counts once',
    roles: [], before: [express.raw({ type: () => true, limit: '512kb' })], response: WebhookAnswerSchema }, async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    const event = verifiedEvent(body, req.get('stripe-signature'));
    const outcome = await handlePaymentEvent(dataSource, event);
    res.json({ received: true, outcome });
  });
  return router;
}
