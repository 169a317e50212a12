import { Router } from 'express';
import {
  AnalysisListQuerySchema,
  AnalysisPageSchema,
  AnalysisSchema,
  IdParamsSchema,
  ReproduceCheckSchema,
  RunAnalysisSchema,
  UpdateRemarksSchema,
  type AnalysisListQuery,
  type RunAnalysis,
  type UpdateRemarks,
} from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { LAB_STAFF } from '../samples/lab-roles';
import { reproduceAnalysis, submitForReview, updateRemarks } from './analysis-service';
import { requestAnalysis } from './analysis-run-job';
import { timed } from './analysis-stages';
import { analysisView, listAnalyses } from './analysis-views';

const tag = 'Analyses';

/** Running, reading and submitting analyses (mounted at /lab). */
export function analysesRouter(): Router {
  const router = Router();
  const analyst = requireRole('analyst');
  const id = (params: unknown) => (params as { id: string }).id;

  registerRoute({ method: 'post', path: '/lab/samples/:id/analyses', tag, summary: 'Analyse the sample’s included replicates against a published library version. Above ANALYSIS_JOB_LOTS lots a worker runs it: 202 with where it is (see …/analysis-run)', roles: ['analyst'], params: IdParamsSchema, body: RunAnalysisSchema, response: AnalysisSchema, status: 201 });
  router.post('/samples/:id/analyses', analyst, validate({ params: IdParamsSchema, body: RunAnalysisSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const asked = await timed('transaction', () => requestAnalysis(res.locals.auth, labId, id(res.locals.params), (res.locals.body as RunAnalysis).libraryVersionId));
    if ('run' in asked) res.status(202).json(asked.run);
    else res.status(201).json(await timed('result-view', () => analysisView(dataSource.manager, labId, asked.analysisId)));
  });

  registerRoute({ method: 'get', path: '/lab/analyses', tag, summary: 'Analyses of the lab (filter by status, e.g. submitted for the review queue, or by sample)', roles: LAB_STAFF, query: AnalysisListQuerySchema, response: AnalysisPageSchema });
  router.get('/analyses', requireRole(...LAB_STAFF), validate({ query: AnalysisListQuerySchema }), async (_req, res) => {
    res.json(await listAnalyses(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as AnalysisListQuery));
  });

  registerRoute({ method: 'get', path: '/lab/analyses/:id', tag, summary: 'An analysis: verdict, distances, map, histogram, fit, quality flags, method snapshot, reviews', roles: LAB_STAFF, params: IdParamsSchema, response: AnalysisSchema });
  router.get('/analyses/:id', requireRole(...LAB_STAFF), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await analysisView(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  registerRoute({ method: 'put', path: '/lab/analyses/:id/remarks', tag, summary: 'The analyst’s remarks on a draft analysis (printed on the report)', roles: ['analyst'], params: IdParamsSchema, body: UpdateRemarksSchema, response: AnalysisSchema });
  router.put('/analyses/:id/remarks', analyst, validate({ params: IdParamsSchema, body: UpdateRemarksSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => updateRemarks(m, res.locals.auth, labId, id(res.locals.params), (res.locals.body as UpdateRemarks).remarks));
    res.json(await analysisView(dataSource.manager, labId, id(res.locals.params)));
  });

  registerRoute({ method: 'post', path: '/lab/analyses/:id/submit', tag, summary: 'Submit a draft analysis for review (the sample goes to in review)', roles: ['analyst'], params: IdParamsSchema, response: AnalysisSchema });
  router.post('/analyses/:id/submit', analyst, validate({ params: IdParamsSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => submitForReview(m, res.locals.auth, labId, id(res.locals.params)));
    res.json(await analysisView(dataSource.manager, labId, id(res.locals.params)));
  });

  registerRoute({ method: 'get', path: '/lab/analyses/:id/reproduce', tag, summary: 'Recompute from the stored replicates and frozen library version, and compare number by number', roles: LAB_STAFF, params: IdParamsSchema, response: ReproduceCheckSchema });
  router.get('/analyses/:id/reproduce', requireRole(...LAB_STAFF), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await reproduceAnalysis(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  return router;
}
