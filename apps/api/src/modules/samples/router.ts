import { Router } from 'express';
import {
  IdParamsSchema,
  SampleDetailSchema,
  SampleLookupParamsSchema,
  WorkQueuePageSchema,
  WorkQueueQuerySchema,
  type WorkQueueQuery,
} from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { LAB_STAFF } from './lab-roles';
import { sampleDetail, workQueue } from './sample-views';

const tag = 'Samples';

/** The lab's work queue and sample look-ups (mounted at /lab). */
export function samplesRouter(): Router {
  const router = Router();

  registerRoute({ method: 'get', path: '/lab/samples', tag, summary: 'Work queue: samples by state, oldest first, with age against the turnaround target', roles: LAB_STAFF, query: WorkQueueQuerySchema, response: WorkQueuePageSchema });
  router.get('/samples', requireRole(...LAB_STAFF), validate({ query: WorkQueueQuerySchema }), async (_req, res) => {
    res.json(await workQueue(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as WorkQueueQuery));
  });

  registerRoute({ method: 'get', path: '/lab/samples/by-code/:code', tag, summary: 'Find a sample by its printed code (exact, any case), as a scanner types it', roles: LAB_STAFF, params: SampleLookupParamsSchema, response: SampleDetailSchema });
  router.get('/samples/by-code/:code', requireRole(...LAB_STAFF), validate({ params: SampleLookupParamsSchema }), async (_req, res) => {
    res.json(await sampleDetail(dataSource.manager, labIdOf(res.locals.auth), { code: (res.locals.params as { code: string }).code }));
  });

  registerRoute({ method: 'get', path: '/lab/samples/:id', tag, summary: 'A sample with its order, product, client, intake record and photos', roles: LAB_STAFF, params: IdParamsSchema, response: SampleDetailSchema });
  router.get('/samples/:id', requireRole(...LAB_STAFF), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await sampleDetail(dataSource.manager, labIdOf(res.locals.auth), { id: (res.locals.params as { id: string }).id }));
  });

  return router;
}
