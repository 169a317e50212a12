import type { JobHandler, JobName } from './core/jobs/jobs';
import { dataSource } from './db/data-source';
import { createMailTransport } from './modules/mail/mail-transport';
import { deliverOutboxMessage } from './modules/mail/outbox-worker';
import { publishLibraryVersion, type LibraryPublishPayload } from './modules/libraries/library-publish-job';
import { runRequestedAnalysis, type AnalysisRunPayload } from './modules/analyses/analysis-run-job';
import { issueApprovedReport, type ReportIssuancePayload } from './modules/reviews/report-issuance-job';

/**
 * What a worker runs for each queue. Handlers are idempotent: pg-boss delivers a job at least once
 * (a retry, or a worker that died mid-job), so each checks the database for work already done.
 */
export function jobHandlers(options: { email: boolean }): Partial<Record<JobName, JobHandler>> {
  const handlers: Partial<Record<JobName, JobHandler>> = {
    'report-issue': (payload, job) => issueApprovedReport(payload as unknown as ReportIssuancePayload, { pickupMs: job.pickupMs }),
    'analysis-run': (payload) => runRequestedAnalysis(payload as unknown as AnalysisRunPayload),
    'library-publish': (payload) => publishLibraryVersion(payload as unknown as LibraryPublishPayload),
  };
  if (options.email) {
    const transport = createMailTransport();
    handlers['email-send'] = (payload) => deliverOutboxMessage(dataSource, transport, String(payload.outboxId));
  }
  return handlers;
}
