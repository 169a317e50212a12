import type { Response, Router } from 'express';
import { z } from 'zod';
import {
  CheckoutStartedSchema,
  CheckoutStatusSchema,
  CreditBalanceSchema,
  CreditPackOfferSchema,
  LedgerListQuerySchema,
  LedgerPageSchema,
  PaymentListQuerySchema,
  PaymentPageSchema,
  SessionParamsSchema,
  StartCheckoutSchema,
  type LedgerListQuery,
  type PaymentListQuery,
  type Role,
} from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { clientOrganisationIdOf, labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { creditBalance, type CreditScope } from '../credits/credit-ledger';
import { abandonCheckout, startCheckout } from './checkout';
import { activePacks } from './credit-packs';
import { checkoutStatus, ledger, payments } from './views';

const tag = 'Credits and payments (client)';
const CLIENTS: Role[] = ['client-admin', 'client-member'];
const scopeOf = (res: Response): CreditScope => ({ labId: labIdOf(res.locals.auth), clientOrganisationId: clientOrganisationIdOf(res.locals.auth) });

/** A producer's credits, the packs on sale, buying one, the ledger and the payments; only their own organisation's. */
export function clientBillingRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/client/credits', tag, summary: 'The organisation’s credits: available to spend and held for open orders',
    roles: CLIENTS, response: CreditBalanceSchema }, async (_req, res) => {
    res.json(await creditBalance(dataSource.manager, scopeOf(res)));
  });

  route({ method: 'get', path: '/client/credit-packs', tag, summary: 'The lab’s credit packs on sale (price in minor units of the currency)',
    roles: CLIENTS, response: z.array(CreditPackOfferSchema) }, async (_req, res) => {
    res.json(await activePacks(dataSource.manager, scopeOf(res).labId));
  });

  route({ method: 'post', path: '/client/credit-checkouts', tag, status: 201,
    summary: 'Start buying a pack: a checkout at the payment service; send the user to `checkoutUrl`. Credits arrive when the payment is confirmed',
    roles: ['client-admin'], body: StartCheckoutSchema, response: CheckoutStartedSchema }, async (_req, res) => {
    const { packId } = res.locals.body as { packId: string };
    const started = await dataSource.transaction((m) => startCheckout(m, scopeOf(res), res.locals.auth.userId, packId));
    res.status(201).json(started);
  });

  route({ method: 'get', path: '/client/credit-checkouts/:sessionId', tag, summary: 'One checkout’s state and the balance (what the page after paying polls)',
    roles: CLIENTS, params: SessionParamsSchema, response: CheckoutStatusSchema }, async (_req, res) => {
    res.json(await checkoutStatus(dataSource.manager, scopeOf(res), (res.locals.params as { sessionId: string }).sessionId));
  });

  route({ method: 'post', path: '/client/credit-checkouts/:sessionId/abandon', tag, summary: 'Close an unpaid checkout (the user went back without paying)',
    roles: ['client-admin'], params: SessionParamsSchema, response: CheckoutStatusSchema }, async (_req, res) => {
    const { sessionId } = res.locals.params as { sessionId: string };
    await abandonCheckout(scopeOf(res), dataSource.manager, sessionId);
    res.json(await checkoutStatus(dataSource.manager, scopeOf(res), sessionId));
  });

  route({ method: 'get', path: '/client/ledger', tag, summary: 'Every movement of the organisation’s credits, with reason, reference, who and balances after',
    roles: CLIENTS, query: LedgerListQuerySchema, response: LedgerPageSchema }, async (_req, res) => {
    res.json(await ledger(dataSource.manager, scopeOf(res), res.locals.query as LedgerListQuery));
  });

  route({ method: 'get', path: '/client/payments', tag, summary: 'The organisation’s payments with their state and receipt numbers',
    roles: CLIENTS, query: PaymentListQuerySchema, response: PaymentPageSchema }, async (_req, res) => {
    const scope = scopeOf(res);
    res.json(await payments(dataSource.manager, scope.labId, scope.clientOrganisationId, res.locals.query as PaymentListQuery));
  });

  return router;
}
