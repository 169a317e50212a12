import type { EntityManager } from 'typeorm';
import type { ApprovalResult } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { enqueue, latestJob } from '../../core/jobs/jobs';
import { dataSource } from '../../db/data-source';
import { Analysis } from '../analyses/analysis.entity';
import { refreshOrderStatus } from '../orders/order-progress';
import { consumeSampleCredits } from '../orders/sample-credits';
import { issueReport } from '../reports/issue-report';
import { StageClock, withStageClock, type IssuanceStages } from '../reports/issuance-stages';
import { logger } from '../../core/logger';
import { findLabSample, moveSample } from '../samples/sample-access';
import { AnalysisReview } from './analysis-review.entity';
import { reportContentFor } from './report-content';

export interface ReportIssuancePayload {
  labId: string;
  analysisId: string;
}

/** Queues the report of an approved analysis (one waiting job per analysis at most). */
export async function enqueueReportIssuance(manager: EntityManager, labId: string, analysisId: string): Promise<void> {
  await enqueue(manager, 'report-issue', { labId, analysisId } satisfies ReportIssuancePayload, { singletonKey: analysisId });
}

/**
 * The job: issues the report of an approved analysis, once. The approval row is locked for the
 * whole transaction and the job ends at once when it already names a report, so a retry, a second
 * worker or a job run again after a crash never issues twice. Number, report row, consumed
 * credits, client notice, the approval's link to the report and the sample's move to `reported`
 * commit together; a crash before commit (even after signing) leaves nothing, and the number it
 * had claimed is the next one handed out (see `claimReportNumber`).
 */
export async function issueApprovedReport(payload: ReportIssuancePayload, timing: { pickupMs?: number } = {}): Promise<{ reportId: string; number: string; already: boolean; stagesMs: IssuanceStages }> {
  const { labId, analysisId } = payload;
  const clock = new StageClock();
  const result = await withStageClock(clock, () => issueInTransaction(labId, analysisId, clock));
  clock.lap('commit');
  const stagesMs: IssuanceStages = { pickup: timing.pickupMs === undefined ? undefined : Math.round(timing.pickupMs), ...clock.finish() };
  logger.info({ analysisId, number: result.number, already: result.already, stagesMs }, 'report issuance stages');
  return { ...result, stagesMs };
}

function issueInTransaction(labId: string, analysisId: string, clock: StageClock): Promise<{ reportId: string; number: string; already: boolean }> {
  return dataSource.transaction(async (manager) => {
    const review = await manager.findOne(AnalysisReview, {
      where: { labId, analysisId, decision: 'approved' },
      order: { decidedAt: 'DESC' },
      lock: { mode: 'pessimistic_write' },
    });
    if (!review) throw new Error(`analysis ${analysisId} has no approval to issue a report for`);
    clock.lap('lockApproval');
    if (review.reportId) {
      const [done]: Array<{ number: string }> = await manager.query('SELECT number FROM test_report WHERE id = $1', [review.reportId]);
      return { reportId: review.reportId, number: done.number, already: true };
    }
    const analysis = await manager.findOneByOrFail(Analysis, { id: analysisId, labId });
    const sample = await findLabSample(manager, labId, analysis.sampleId, true);
    const [reviewer]: Array<{ display_name: string }> = await manager.query('SELECT display_name FROM app_user WHERE id = $1', [review.reviewerUserId]);
    const { content, clientOrganisationId } = await reportContentFor(manager, analysis, reviewer.display_name);
    const report = await issueReport(manager, {
      labId, analysisId, sampleId: sample.id, clientOrganisationId, actorUserId: review.reviewerUserId, content, issuedAt: review.decidedAt,
      steps: [(m, issued) => consumeSampleCredits(m, labId, sample.id, `Report ${issued.number} issued`, review.reviewerUserId).then(() => undefined)],
    });
    await manager.update(AnalysisReview, { id: review.id, labId }, { reportId: report.id });
    await moveSample(manager, sample, 'reported');
    await refreshOrderStatus(manager, labId, sample.orderId);
    clock.lap('finish');
    return { reportId: report.id, number: report.number, already: false };
  });
}

/** Where the report of an approved analysis is (the review screen polls this while it waits). */
export async function reportIssuanceOf(manager: EntityManager, labId: string, analysisId: string): Promise<ApprovalResult> {
  // One small row per ask: the analysis's status and its latest approval's report, if any.
  const [row]: Array<{ status: string; approved: boolean; report_id: string | null; number: string | null }> = await manager.query(
    `SELECT a.status, r.analysis_id IS NOT NULL AS approved, r.report_id, t.number
       FROM analysis a
       LEFT JOIN LATERAL (SELECT analysis_id, report_id FROM analysis_review
                           WHERE analysis_id = a.id AND lab_id = a.lab_id AND decision = 'approved' ORDER BY decided_at DESC LIMIT 1) r ON true
       LEFT JOIN test_report t ON t.id = r.report_id
      WHERE a.id = $1 AND a.lab_id = $2`,
    [analysisId, labId],
  );
  if (!row) throw ApiError.notFound('Analysis');
  if (!row.approved) throw ApiError.conflict(`This analysis is ${row.status}; it has no approval, so no report is being issued.`);
  if (row.report_id) return { analysisId, state: 'issued', report: { id: row.report_id, number: row.number as string }, detail: null };
  const job = await latestJob(manager, 'report-issue', analysisId);
  if (job?.state === 'failed') {
    return { analysisId, state: 'failed', report: null, detail: 'Issuing the report failed after several attempts. Ask your lab admin to check the signing certificate, then retry.' };
  }
  return { analysisId, state: 'issuing', report: null, detail: null };
}
