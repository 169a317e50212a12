import type { Router } from 'express';
import { ApprovalResultSchema, IdParamsSchema } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { enqueueReportIssuance, reportIssuanceOf } from './report-issuance-job';

const tag = 'Review';

/** Where an approved analysis's report is, and a retry after every attempt failed. */
export function reportIssuanceRouter(): Router {
  const { router, route } = routeTable();
  const id = (params: unknown) => (params as { id: string }).id;

  route({ method: 'get', path: '/lab/analyses/:id/issuance', tag, summary: 'Where the report of an approved analysis is: issuing, issued (with its number) or failed', roles: ['reviewer', 'lab-admin', 'analyst'], params: IdParamsSchema, response: ApprovalResultSchema }, async (_req, res) => {
    res.json(await reportIssuanceOf(dataSource.manager, labIdOf(res.locals.auth), id(res.locals.params)));
  });

  route({ method: 'post', path: '/lab/analyses/:id/issuance/retry', tag, summary: 'Queue the report of an approved analysis again after every attempt failed (409 unless it failed)', roles: ['reviewer', 'lab-admin'], params: IdParamsSchema, response: ApprovalResultSchema, status: 202 }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const analysisId = id(res.locals.params);
    const result = await dataSource.transaction(async (manager) => {
      await manager.query('SELECT 1 FROM analysis WHERE id = $1 AND lab_id = $2 FOR UPDATE', [analysisId, labId]);
      const now = await reportIssuanceOf(manager, labId, analysisId);
      if (now.state !== 'failed') throw ApiError.conflict(`The report is ${now.state}; only a failed issuance can be retried.`);
      await enqueueReportIssuance(manager, labId, analysisId);
      await recordAudit(manager, { labId, actorUserId: res.locals.auth.userId, action: 'report.issuance-retried', subjectType: 'analysis', subjectId: analysisId, details: {} });
      return { ...now, state: 'issuing' as const, detail: null };
    });
    res.status(202).json(result);
  });

  return router;
}
