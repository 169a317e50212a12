import { Router } from 'express';
import {
  ClientOrderListQuerySchema,
  IdParamsSchema,
  OrderPageSchema,
  OrderSummarySchema,
  ProductListQuerySchema,
  ProductPageSchema,
  type ClientOrderListQuery,
  type ProductListQuery,
  type Role,
} from '@ohmprint/contracts';
import type { Response } from 'express';
import { clientOrganisationIdOf, labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { clientOrder, clientOrders, clientProducts, type ClientScope } from './client-views';

const tag = 'Client orders';
const CLIENTS: Role[] = ['client-admin', 'client-member'];
const scopeOf = (res: Response): ClientScope => ({ labId: labIdOf(res.locals.auth), clientOrganisationId: clientOrganisationIdOf(res.locals.auth) });

/** A producer's own orders and products (mounted at /client); another organisation's answer 404. */
export function clientOrdersRouter(): Router {
  const router = Router();
  const client = requireRole(...CLIENTS);

  registerRoute({ method: 'get', path: '/client/orders', tag, summary: 'The organisation’s orders with their samples and states', roles: CLIENTS, query: ClientOrderListQuerySchema, response: OrderPageSchema });
  router.get('/orders', client, validate({ query: ClientOrderListQuerySchema }), async (_req, res) => {
    res.json(await clientOrders(dataSource.manager, scopeOf(res), res.locals.query as ClientOrderListQuery));
  });

  registerRoute({ method: 'get', path: '/client/orders/:id', tag, summary: 'One order with its samples', roles: CLIENTS, params: IdParamsSchema, response: OrderSummarySchema });
  router.get('/orders/:id', client, validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await clientOrder(dataSource.manager, scopeOf(res), (res.locals.params as { id: string }).id));
  });

  registerRoute({ method: 'get', path: '/client/products', tag, summary: 'The organisation’s products and their published reference library versions', roles: CLIENTS, query: ProductListQuerySchema, response: ProductPageSchema });
  router.get('/products', client, validate({ query: ProductListQuerySchema }), async (_req, res) => {
    res.json(await clientProducts(dataSource.manager, scopeOf(res), res.locals.query as ProductListQuery));
  });

  return router;
}
