import type { Router } from 'express';
import { AnalysisRunSchema, IdParamsSchema } from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { LAB_STAFF } from '../samples/lab-roles';
import { analysisRunOf } from './analysis-run-job';

/** Where a sample's analysis on a worker is (large libraries). */
export function analysisRunRouter(): Router {
  const { router, route } = routeTable();
  route({ method: 'get', path: '/lab/samples/:id/analysis-run', tag: 'Analyses', summary: 'Where the sample’s latest analysis on a worker is: idle, queued, running (scoring against the lots), done (with the analysis) or failed with the reason', roles: LAB_STAFF, params: IdParamsSchema, response: AnalysisRunSchema }, async (_req, res) => {
    res.json(await analysisRunOf(dataSource.manager, labIdOf(res.locals.auth), (res.locals.params as { id: string }).id));
  });
  return router;
}
