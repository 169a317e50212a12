import type { Response, Router } from 'express';
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
import { routeTable } from '../../core/route-table';
import { clientOrganisationIdOf, labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { clientOrder, clientOrders, clientProducts, type ClientScope } from './client-views';

const tag = 'Client orders';
const CLIENTS: Role[] = ['client-admin', 'client-member'];
const scopeOf = (res: Response): ClientScope => ({ labId: labIdOf(res.locals.auth), clientOrganisationId: clientOrganisationIdOf(res.locals.auth) });

/** A producer's own orders and products; another organisation's answer 404. */
export function clientOrdersRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/client/orders', tag, summary: 'The organisation’s orders with their samples and states',
    roles: CLIENTS, query: ClientOrderListQuerySchema, response: OrderPageSchema }, async (_req, res) => {
    res.json(await clientOrders(dataSource.manager, scopeOf(res), res.locals.query as ClientOrderListQuery));
  });

  route({ method: 'get', path: '/client/orders/:id', tag, summary: 'One order with its samples',
    roles: CLIENTS, params: IdParamsSchema, response: OrderSummarySchema }, async (_req, res) => {
    res.json(await clientOrder(dataSource.manager, scopeOf(res), (res.locals.params as { id: string }).id));
  });

  route({ method: 'get', path: '/client/products', tag,
    summary: 'The organisation’s products and their published reference library versions',
    roles: CLIENTS, query: ProductListQuerySchema, response: ProductPageSchema }, async (_req, res) => {
    res.json(await clientProducts(dataSource.manager, scopeOf(res), res.locals.query as ProductListQuery));
  });

  return router;
}
