import type { EntityManager } from 'typeorm';
import type { ReportCorrections } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { Lab } from '../labs/lab.entity';
import { ReportContent } from './pdf/report-data';
import { TestReport } from './test-report.entity';
import { revisionNumber } from './report-numbering';
import { notifyClient, storeSignedReport } from './issue-report';

/**
 * Amending and revoking, allowed to lab admins and reviewers: both are decisions about an issued
 * report, which reviewers authorise, and lab admins answer for the lab's output. Only the
 * current revision (status "issued") can be amended or revoked.
 */
async function lockCurrent(manager: EntityManager, labId: string, reportId: string): Promise<TestReport> {
  const report = await manager
    .getRepository(TestReport)
    .createQueryBuilder('r')
    .setLock('pessimistic_write')
    .where('r.id = :reportId AND r.lab_id = :labId', { reportId, labId })
    .getOne();
  if (!report) throw ApiError.notFound('The report');
  if (report.status === 'superseded') {
    const next = report.supersededByReportId ? await manager.findOneBy(TestReport, { id: report.supersededByReportId }) : null;
    throw ApiError.conflict(`Report ${report.number} is already superseded by ${next?.number ?? 'a later revision'}; amend or revoke that one instead.`);
  }
  if (report.status === 'revoked') throw ApiError.conflict(`Report ${report.number} was revoked and can no longer be changed.`);
  return report;
}

function authorisingRole(auth: AuthContext): string {
  return auth.roles.includes('reviewer') ? 'Reviewer' : 'Lab administrator';
}

/** The stored content with the corrections applied; results are never edited here. */
export function applyCorrections(content: ReportContent, corrections: ReportCorrections, authorisedBy: ReportContent['authorisedBy']): ReportContent {
  const sample = { ...content.sample };
  for (const [key, value] of Object.entries(corrections.sample ?? {})) {
    if (value !== undefined) (sample as Record<string, unknown>)[key] = value;
  }
  return {
    ...content,
    sample,
    client: { ...content.client, ...(corrections.client ?? {}) },
    remarks: corrections.remarks === undefined ? content.remarks : corrections.remarks || null,
    authorisedBy,
  };
}

/** Issues revision n+1 with a new number and code, and marks the one it replaces superseded. */
export async function amendReport(
  manager: EntityManager,
  auth: AuthContext,
  labId: string,
  reportId: string,
  request: { reason: string; corrections: ReportCorrections },
): Promise<TestReport> {
  const previous = await lockCurrent(manager, labId, reportId);
  const lab = await manager.findOneByOrFail(Lab, { id: labId });
  const { reportNumber: _number, issuedAt: _issuedAt, replaces: _replaces, verification: _verification, ...stored } = previous.content;
  const content = applyCorrections(stored, request.corrections, { name: auth.displayName, role: authorisingRole(auth) });
  const revision = previous.revision + 1;
  const amended = await storeSignedReport(manager, lab, {
    content,
    number: revisionNumber(previous.baseNumber, revision),
    baseNumber: previous.baseNumber,
    revision,
    replaces: { id: previous.id, reportNumber: previous.number, reason: request.reason },
    issuedAt: new Date(),
    actorUserId: auth.userId,
    analysisId: previous.analysisId,
    sampleId: previous.sampleId,
    clientOrganisationId: previous.clientOrganisationId,
  });
  await manager.update(TestReport, { id: previous.id }, { status: 'superseded', supersededByReportId: amended.id });
  await recordAudit(manager, {
    labId,
    actorUserId: auth.userId,
    action: 'report.amended',
    subjectType: 'test-report',
    subjectId: amended.id,
    details: { number: amended.number, replaces: previous.number, reason: request.reason, corrections: request.corrections },
  });
  await notifyClient(manager, amended, 'report-amended', {
    subject: `Test report ${previous.number} has been amended`,
    lines: [
      `${lab.name} has issued report ${amended.number}, which replaces report ${previous.number} for sample ${amended.sampleCode}.`,
      `Reason: ${request.reason}`,
      `Report ${previous.number} is superseded; please use ${amended.number} from now on.`,
    ],
  });
  return amended;
}

export async function revokeReport(manager: EntityManager, auth: AuthContext, labId: string, reportId: string, reason: string): Promise<TestReport> {
  const report = await lockCurrent(manager, labId, reportId);
  const revokedAt = new Date();
  await manager.update(TestReport, { id: report.id }, { status: 'revoked', revokedAt, revokedByUserId: auth.userId, revocationReason: reason });
  await recordAudit(manager, {
    labId,
    actorUserId: auth.userId,
    action: 'report.revoked',
    subjectType: 'test-report',
    subjectId: report.id,
    details: { number: report.number, reason },
  });
  const lab = await manager.findOneByOrFail(Lab, { id: labId });
  await notifyClient(manager, report, 'report-revoked', {
    subject: `Test report ${report.number} has been revoked`,
    lines: [`${lab.name} has revoked test report ${report.number} for sample ${report.sampleCode}.`, `Reason: ${reason}`, 'The report should no longer be relied on.'],
  });
  return { ...report, status: 'revoked', revokedAt, revokedByUserId: auth.userId, revocationReason: reason };
}
