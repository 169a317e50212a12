import type { Router } from 'express';
import { IdParamsSchema, LotDistancePageQuerySchema, LotDistancePageSchema, ReferenceBandViewSchema, type LotDistancePageQuery } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { referenceBandView } from '../libraries/reference-band';
import { LAB_STAFF } from '../samples/lab-roles';
import { lotDistancePage } from './lot-distances';

/** What a result screen reads beside the analysis: every lot's distance page by page, and the version's stored band. */
export function slimResultsRouter(): Router {
  const { router, route } = routeTable();
  const id = (params: unknown) => (params as { id: string }).id;

  route(
    { method: 'get', path: '/lab/analyses/:id/lot-distances', tag: 'Analyses', summary: 'Every reference lot’s distance to the sample, nearest first, a page at a time (`after` = last rank read)', roles: LAB_STAFF, params: IdParamsSchema, query: LotDistancePageQuerySchema, response: LotDistancePageSchema },
    async (_req, res) => {
      const q = res.locals.query as LotDistancePageQuery;
      res.json(await lotDistancePage(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params), q.after, q.limit));
    },
  );

  route(
    { method: 'get', path: '/lab/library-versions/:id/reference-band', tag: 'Libraries', summary: 'A published version’s reference band (range of its lots at each grid frequency), stored when it was published', roles: ['analyst', 'reviewer', 'lab-admin'], params: IdParamsSchema, response: ReferenceBandViewSchema },
    async (_req, res) => {
      const view = await referenceBandView(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params));
      if (!view) throw ApiError.notFound('Reference band');
      res.json(view);
    },
  );
  return router;
}
