import { Router, type Response } from 'express';
import {
  AmendReportRequestSchema,
  IdParamsSchema,
  ReportDetailSchema,
  ReportListQuerySchema,
  ReportSummarySchema,
  RevokeReportRequestSchema,
  pageOf,
  type AmendReportRequest,
  type ReportListQuery,
  type RevokeReportRequest,
} from '@ohmprint/contracts';
import { labIdOf, validate } from '../../core';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { amendReport, revokeReport } from './report-revisions';
import { listReports, reportDetail, reportPdf } from './report-queries';

const tag = 'Reports';
const READERS = ['lab-admin', 'reviewer', 'analyst'] as const;
const DECIDERS = ['lab-admin', 'reviewer'] as const;

/** Sends a stored PDF exactly as issued, with its SHA-256 as a representation digest (RFC 9530). */
export function sendPdf(res: Response, file: { number: string; pdf: Buffer; sha256: string }): void {
  res
    .status(200)
    .type('application/pdf')
    .set('Content-Disposition', `attachment; filename="${file.number}.pdf"`)
    .set('Repr-Digest', `sha-256=:${Buffer.from(file.sha256, 'hex').toString('base64')}:`)
    .set('Cache-Control', 'private, no-store')
    .send(file.pdf);
}

/** The lab's reports: list, detail, download, amend and revoke, always scoped to the caller's lab. */
export function labReportsRouter(): Router {
  const router = Router();

  registerRoute({ method: 'get', path: '/lab/reports', tag, summary: "The lab's issued reports (search, sort, paging, status filter)", roles: READERS, query: ReportListQuerySchema, response: pageOf(ReportSummarySchema) });
  router.get('/', requireRole(...READERS), validate({ query: ReportListQuerySchema }), async (_req, res) => {
    res.json(await listReports(dataSource.manager, { labId: labIdOf(res.locals.auth) }, res.locals.query as ReportListQuery));
  });

  registerRoute({ method: 'get', path: '/lab/reports/:id', tag, summary: 'One report with its verification code and revision links', roles: READERS, params: IdParamsSchema, response: ReportDetailSchema });
  router.get('/:id', requireRole(...READERS), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await reportDetail(dataSource.manager, { labId: labIdOf(res.locals.auth) }, (res.locals.params as { id: string }).id));
  });

  registerRoute({ method: 'get', path: '/lab/reports/:id/pdf', tag, summary: 'Download the signed PDF as issued', roles: READERS, params: IdParamsSchema, responseMediaType: 'application/pdf' });
  router.get('/:id/pdf', requireRole(...READERS), validate({ params: IdParamsSchema }), async (_req, res) => {
    sendPdf(res, await reportPdf(dataSource.manager, { labId: labIdOf(res.locals.auth) }, (res.locals.params as { id: string }).id));
  });

  registerRoute({ method: 'post', path: '/lab/reports/:id/amend', tag, summary: 'Issue a corrected revision (-R1, -R2…) that supersedes this report', roles: DECIDERS, params: IdParamsSchema, body: AmendReportRequestSchema, response: ReportDetailSchema, status: 201 });
  router.post('/:id/amend', requireRole(...DECIDERS), validate({ params: IdParamsSchema, body: AmendReportRequestSchema }), async (_req, res) => {
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const { id } = res.locals.params as { id: string };
    const amended = await dataSource.transaction((manager) => amendReport(manager, auth, labId, id, res.locals.body as AmendReportRequest));
    res.status(201).json(await reportDetail(dataSource.manager, { labId }, amended.id));
  });

  registerRoute({ method: 'post', path: '/lab/reports/:id/revoke', tag, summary: 'Revoke a report with a reason (the public page then says so)', roles: DECIDERS, params: IdParamsSchema, body: RevokeReportRequestSchema, response: ReportDetailSchema });
  router.post('/:id/revoke', requireRole(...DECIDERS), validate({ params: IdParamsSchema, body: RevokeReportRequestSchema }), async (_req, res) => {
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const { id } = res.locals.params as { id: string };
    await dataSource.transaction((manager) => revokeReport(manager, auth, labId, id, (res.locals.body as RevokeReportRequest).reason));
    res.json(await reportDetail(dataSource.manager, { labId }, id));
  });

  return router;
}
