import type { EntityManager } from 'typeorm';
import type { ApprovalResult } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { Analysis } from '../analyses/analysis.entity';
import { recordAudit } from '../audit/record-audit';
import { enqueueEmail } from '../mail/enqueue-email';
import { refreshOrderStatus } from '../orders/order-progress';
import { issueReport } from '../reports/issue-report';
import { consumeSampleCredits } from '../orders/sample-credits';
import { findLabSample, moveSample } from '../samples/sample-access';
import { AnalysisReview } from './analysis-review.entity';
import { reportContentFor } from './report-content';

/** A submitted analysis, locked, that this reviewer may decide on (four-eyes rule). */
async function reviewable(manager: EntityManager, auth: AuthContext, labId: string, analysisId: string): Promise<Analysis> {
  const analysis = await manager.findOne(Analysis, { where: { id: analysisId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!analysis) throw ApiError.notFound('Analysis');
  if (analysis.analystUserId === auth.userId) {
    throw new ApiError(403, 'Four-eyes rule', 'You ran this analysis, so another reviewer must decide on it, even if you also hold the reviewer role.', { type: 'four-eyes' });
  }
  if (analysis.status !== 'submitted') throw ApiError.conflict(`This analysis is ${analysis.status}; only a submitted analysis can be reviewed.`);
  return analysis;
}

/**
 * Approves and issues the report in the caller's transaction: if signing or storing the report
 * fails, the approval is rolled back with it.
 */
export async function approveAnalysis(manager: EntityManager, auth: AuthContext, labId: string, analysisId: string, comments: string): Promise<ApprovalResult> {
  const analysis = await reviewable(manager, auth, labId, analysisId);
  const sample = await findLabSample(manager, labId, analysis.sampleId, true);
  const decidedAt = new Date();
  const review = await manager.insert(AnalysisReview, { labId, analysisId, reviewerUserId: auth.userId, decision: 'approved', comments, reportId: null, decidedAt });
  await manager.update(Analysis, { id: analysisId, labId }, { status: 'approved' });
  await moveSample(manager, sample, 'reported');
  await refreshOrderStatus(manager, labId, sample.orderId);
  const { content, clientOrganisationId } = await reportContentFor(manager, analysis, auth.displayName);
  const report = await issueReport(manager, {
    labId, analysisId, sampleId: sample.id, clientOrganisationId, actorUserId: auth.userId, content, issuedAt: decidedAt,
    steps: [(m, issued) => consumeSampleCredits(m, labId, sample.id, `Report ${issued.number} issued`, auth.userId).then(() => undefined)],
  });
  await manager.update(AnalysisReview, { id: review.identifiers[0].id as string, labId }, { reportId: report.id });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'analysis.approved', subjectType: 'analysis', subjectId: analysisId, details: { sampleCode: sample.code, reportNumber: report.number } });
  return { analysisId, report: { id: report.id, number: report.number } };
}

/** Sends the analysis back with comments; the sample returns to the analyst, who is e-mailed. */
export async function returnAnalysis(manager: EntityManager, auth: AuthContext, labId: string, analysisId: string, comments: string): Promise<void> {
  const analysis = await reviewable(manager, auth, labId, analysisId);
  const sample = await findLabSample(manager, labId, analysis.sampleId, true);
  await manager.insert(AnalysisReview, { labId, analysisId, reviewerUserId: auth.userId, decision: 'returned', comments, reportId: null, decidedAt: new Date() });
  await manager.update(Analysis, { id: analysisId, labId }, { status: 'returned' });
  await moveSample(manager, sample, 'returned-for-rework');
  const [analyst] = await manager.query(`SELECT email, display_name FROM app_user WHERE id = $1`, [analysis.analystUserId]);
  await enqueueEmail(manager, {
    labId,
    to: analyst.email,
    subject: `Analysis of ${sample.code} returned for rework`,
    text: `Dear ${analyst.display_name},\n\n${auth.displayName} returned your analysis of sample ${sample.code} with these comments:\n\n${comments}\n\nThe sample is back in your queue.`,
  });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'analysis.returned', subjectType: 'analysis', subjectId: analysisId, details: { sampleCode: sample.code, comments } });
}
