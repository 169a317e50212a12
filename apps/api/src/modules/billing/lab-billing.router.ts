import type { Router } from 'express';
import { z } from 'zod';
import {
  CreateCreditPackSchema,
  CreditAccountListQuerySchema,
  CreditAccountPageSchema,
  CreditAdjustedSchema,
  CreditAdjustmentSchema,
  CreditPackSchema,
  CreditPricesSchema,
  IdParamsSchema,
  PaymentListQuerySchema,
  PaymentPageSchema,
  PaymentSchema,
  UpdateCreditPackSchema,
  type CreateCreditPack,
  type CreditAccountListQuery,
  type CreditAdjustment,
  type CreditPrices,
  type PaymentListQuery,
  type UpdateCreditPack,
} from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { Lab } from '../labs/lab.entity';
import { adjustCredits } from './adjustments';
import { createPack, labPacks, updatePack } from './credit-packs';
import { refundPayment } from './refunds';
import { creditAccounts, payments } from './views';

const tag = 'Billing (lab)';
const ADMIN = ['lab-admin'] as const;

/** The lab admin's side of billing: prices in credits, credit packs, every client's payments, refunds and adjustments. */
export function labBillingRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/lab/credit-prices', tag, summary: 'Credits charged per check sample and per reference lot',
    roles: ADMIN, response: CreditPricesSchema }, async (_req, res) => {
    const lab = await dataSource.manager.findOneByOrFail(Lab, { id: labIdOf(res.locals.auth) });
    res.json({ creditsPerCheckSample: lab.creditsPerCheckSample, creditsPerReferenceLot: lab.creditsPerReferenceLot });
  });

  route({ method: 'put', path: '/lab/credit-prices', tag, summary: 'Change the credits charged per check sample and per reference lot (new orders only)',
    roles: ADMIN, body: CreditPricesSchema, response: CreditPricesSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const next = res.locals.body as CreditPrices;
    await dataSource.transaction(async (m) => {
      const lab = await m.findOneOrFail(Lab, { where: { id: labId }, lock: { mode: 'pessimistic_write' } });
      await m.update(Lab, { id: labId }, next);
      await recordAudit(m, { labId, actorUserId: res.locals.auth.userId, action: 'credit-prices.changed', subjectType: 'lab', subjectId: labId,
        details: { before: { creditsPerCheckSample: lab.creditsPerCheckSample, creditsPerReferenceLot: lab.creditsPerReferenceLot }, after: next } });
    });
    res.json(next);
  });

  route({ method: 'get', path: '/lab/credit-packs', tag, summary: 'Every credit pack of the lab, on sale and retired',
    roles: ADMIN, response: z.array(CreditPackSchema) }, async (_req, res) => {
    res.json(await labPacks(dataSource.manager, labIdOf(res.locals.auth)));
  });

  route({ method: 'post', path: '/lab/credit-packs', tag, status: 201, summary: 'A new credit pack (price in minor units), with its product and price at the payment service',
    roles: ADMIN, body: CreateCreditPackSchema, response: CreditPackSchema }, async (_req, res) => {
    const pack = await dataSource.transaction((m) => createPack(m, labIdOf(res.locals.auth), res.locals.auth.userId, res.locals.body as CreateCreditPack));
    res.status(201).json(pack);
  });

  route({ method: 'patch', path: '/lab/credit-packs/:id', tag,
    summary: 'Change a pack; a new price makes a new price at the payment service and retires the old one; `active: false` retires the pack',
    roles: ADMIN, params: IdParamsSchema, body: UpdateCreditPackSchema, response: CreditPackSchema }, async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    res.json(await dataSource.transaction((m) => updatePack(m, labIdOf(res.locals.auth), res.locals.auth.userId, id, res.locals.body as UpdateCreditPack)));
  });

  route({ method: 'get', path: '/lab/payments', tag, summary: 'Payments of every client of the lab',
    roles: ADMIN, query: PaymentListQuerySchema, response: PaymentPageSchema }, async (_req, res) => {
    res.json(await payments(dataSource.manager, labIdOf(res.locals.auth), null, res.locals.query as PaymentListQuery));
  });

  route({ method: 'post', path: '/lab/payments/:id/refund', tag,
    summary: 'Refund a paid pack whose credits are unused (409 `credits-in-use` says why not otherwise)',
    roles: ADMIN, params: IdParamsSchema, response: PaymentSchema }, async (_req, res) => {
    const { id } = res.locals.params as { id: string };
    res.json(await dataSource.transaction((m) => refundPayment(m, labIdOf(res.locals.auth), res.locals.auth.userId, id)));
  });

  route({ method: 'get', path: '/lab/credit-accounts', tag, summary: 'Each client organisation’s credits',
    roles: ADMIN, query: CreditAccountListQuerySchema, response: CreditAccountPageSchema }, async (_req, res) => {
    res.json(await creditAccounts(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as CreditAccountListQuery));
  });

  route({ method: 'post', path: '/lab/credit-adjustments', tag, status: 201, summary: 'Add or remove credits by hand, with a reason (audited)',
    roles: ADMIN, body: CreditAdjustmentSchema, response: CreditAdjustedSchema }, async (_req, res) => {
    const result = await dataSource.transaction((m) => adjustCredits(m, labIdOf(res.locals.auth), res.locals.auth.userId, res.locals.body as CreditAdjustment));
    res.status(201).json(result);
  });

  return router;
}
