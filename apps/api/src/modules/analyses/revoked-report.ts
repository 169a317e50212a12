import type { EntityManager } from 'typeorm';
import { ApiError } from '../../core/api-error';
import type { Sample } from '../samples/sample.entity';

export interface RevokedReport {
  id: string;
  number: string;
  reason: string;
  revokedAt: string;
}

/**
 * The report a new one for this sample follows: its latest revoked report, when no report of the
 * sample is in force (an issued revision). Null when the sample has no revoked report.
 */
export async function revokedReportOf(manager: EntityManager, labId: string, sampleId: string): Promise<RevokedReport | null> {
  const rows: { id: string; number: string; status: string; revocation_reason: string | null; revoked_at: Date | null }[] = await manager.query(
    `SELECT id, number, status, revocation_reason, revoked_at FROM test_report
     WHERE lab_id = $1 AND sample_id = $2 AND status IN ('issued', 'revoked')
     ORDER BY (status = 'issued') DESC, revoked_at DESC NULLS LAST, number DESC`,
    [labId, sampleId],
  );
  const latest = rows[0];
  if (!latest || latest.status !== 'revoked') return null;
  return { id: latest.id, number: latest.number, reason: latest.revocation_reason ?? '', revokedAt: (latest.revoked_at ?? new Date()).toISOString() };
}

/**
 * A reported sample is worked on again only once its report is revoked: the report in force
 * would otherwise stand beside a second result for the same sample.
 */
export async function requireRevokedIfReported(manager: EntityManager, sample: Sample, doing: string): Promise<void> {
  if (sample.state !== 'reported') return;
  if (await revokedReportOf(manager, sample.labId, sample.id)) return;
  throw ApiError.conflict(`Sample ${sample.code} has a report in force; ${doing} needs that report to be revoked first.`);
}
