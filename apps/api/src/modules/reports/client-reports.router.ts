import { Router } from 'express';
import { IdParamsSchema, ReportListQuerySchema, ReportSummarySchema, pageOf, type ReportListQuery } from '@ohmprint/contracts';
import { clientOrganisationIdOf, labIdOf, validate } from '../../core';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { listReports, reportPdf } from './report-queries';
import { sendPdf } from './lab-reports.router';

const tag = 'Reports';
const CLIENTS = ['client-admin', 'client-member'] as const;

/** A client organisation's own reports; another organisation's answer 404. */
export function clientReportsRouter(): Router {
  const router = Router();
  const scopeOf = (auth: Parameters<typeof labIdOf>[0]) => ({ labId: labIdOf(auth), clientOrganisationId: clientOrganisationIdOf(auth) });

  registerRoute({ method: 'get', path: '/client/reports', tag, summary: "The organisation's reports, newest first", roles: CLIENTS, query: ReportListQuerySchema, response: pageOf(ReportSummarySchema) });
  router.get('/', requireRole(...CLIENTS), validate({ query: ReportListQuerySchema }), async (_req, res) => {
    res.json(await listReports(dataSource.manager, scopeOf(res.locals.auth), res.locals.query as ReportListQuery));
  });

  registerRoute({ method: 'get', path: '/client/reports/:id/pdf', tag, summary: 'Download a signed report PDF as issued', roles: CLIENTS, params: IdParamsSchema, responseMediaType: 'application/pdf' });
  router.get('/:id/pdf', requireRole(...CLIENTS), validate({ params: IdParamsSchema }), async (_req, res) => {
    sendPdf(res, await reportPdf(dataSource.manager, scopeOf(res.locals.auth), (res.locals.params as { id: string }).id));
  });

  return router;
}
