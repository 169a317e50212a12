import type { EntityManager } from 'typeorm';
import type { ApprovalResult } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { Analysis } from '../analyses/analysis.entity';
import { recordAudit } from '../audit/record-audit';
import { enqueueEmail } from '../mail/enqueue-email';
import { findLabSample, moveSample } from '../samples/sample-access';
import { enqueueReportIssuance } from './report-issuance-job';
import { AnalysisReview } from './analysis-review.entity';

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
 * Approves: records the decision and queues the report's issuance in the caller's transaction,
 * so the approval and its job commit together. A worker then numbers, renders, signs and stores
 * the report (`issueApprovedReport`); the sample moves to `reported` when the report exists.
 */
export async function approveAnalysis(manager: EntityManager, auth: AuthContext, labId: string, analysisId: string, comments: string): Promise<ApprovalResult> {
  const analysis = await reviewable(manager, auth, labId, analysisId);
  const sample = await findLabSample(manager, labId, analysis.sampleId, true);
  await manager.insert(AnalysisReview, { labId, analysisId, reviewerUserId: auth.userId, decision: 'approved', comments, reportId: null, decidedAt: new Date() });
  await manager.update(Analysis, { id: analysisId, labId }, { status: 'approved' });
  await enqueueReportIssuance(manager, labId, analysisId);
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'analysis.approved', subjectType: 'analysis', subjectId: analysisId, details: { sampleCode: sample.code } });
  return { analysisId, state: 'issuing', report: null, detail: null };
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
