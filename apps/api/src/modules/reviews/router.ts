import { Router } from 'express';
import { AnalysisSchema, ApprovalResultSchema, ApproveAnalysisSchema, IdParamsSchema, ReturnAnalysisSchema, type ApproveAnalysis, type ReturnAnalysis } from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { analysisView } from '../analyses/analysis-views';
import { requireRole } from '../auth/require-auth';
import { approveAnalysis, returnAnalysis } from './review-service';

const tag = 'Review';

/** The reviewer's decision (mounted at /lab); the review queue is GET /lab/analyses?status=submitted. */
export function reviewsRouter(): Router {
  const router = Router();
  const reviewer = requireRole('reviewer');
  const id = (params: unknown) => (params as { id: string }).id;

  registerRoute({ method: 'post', path: '/lab/analyses/:id/approve', tag, summary: 'Approve a submitted analysis (never by its own analyst: 403 four-eyes); answers 202 while a worker issues the signed report: follow GET /lab/analyses/:id/issuance', roles: ['reviewer'], params: IdParamsSchema, body: ApproveAnalysisSchema, response: ApprovalResultSchema, status: 202 });
  router.post('/analyses/:id/approve', reviewer, validate({ params: IdParamsSchema, body: ApproveAnalysisSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    res.status(202).json(await dataSource.transaction((m) => approveAnalysis(m, res.locals.auth, labId, id(res.locals.params), (res.locals.body as ApproveAnalysis).comments)));
  });

  registerRoute({ method: 'post', path: '/lab/analyses/:id/return', tag, summary: 'Return a submitted analysis to its analyst with comments (sample → returned for rework)', roles: ['reviewer'], params: IdParamsSchema, body: ReturnAnalysisSchema, response: AnalysisSchema });
  router.post('/analyses/:id/return', reviewer, validate({ params: IdParamsSchema, body: ReturnAnalysisSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => returnAnalysis(m, res.locals.auth, labId, id(res.locals.params), (res.locals.body as ReturnAnalysis).comments));
    res.json(await analysisView(dataSource.manager, labId, id(res.locals.params)));
  });

  return router;
}
