import type { EntityManager } from 'typeorm';
import type { AnalysisRun } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { enqueue, latestJob } from '../../core/jobs/jobs';
import { config } from '../../config';
import { dataSource } from '../../db/data-source';
import type { AuthContext } from '../auth/auth-context';
import { findLabSample } from '../samples/sample-access';
import { runAnalysis } from './analysis-service';
import { timed } from './analysis-stages';

export interface AnalysisRunPayload {
  labId: string;
  sampleId: string;
  libraryVersionId: string;
  auth: AuthContext;
  /** When the analyst asked: a run that already stored an analysis since then is not run again. */
  requestedAt: string;
}

/**
 * The version's included lots, from the tally triggers keep (`library_version_tally`), so asking
 * does not count 50,000 rows on every analysis; counted only for a version without a tally row.
 */
async function includedLots(manager: EntityManager, labId: string, libraryVersionId: string): Promise<number | null> {
  const [row]: Array<{ n: number }> = await manager.query(
    `SELECT COALESCE(t.included_lots, (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id AND r.lab_id = v.lab_id AND r.included)) AS n
       FROM library_version v LEFT JOIN library_version_tally t ON t.library_version_id = v.id AND t.lab_id = v.lab_id
      WHERE v.id = $1 AND v.lab_id = $2`,
    [libraryVersionId, labId],
  );
  return row ? row.n : null;
}

/**
 * An analyst asks to analyse a sample. Against a version of up to `ANALYSIS_JOB_LOTS` included lots
 * it runs at once (`{ analysisId }`); above, an `analysis-run` job is queued, unless one for this
 * sample already waits or runs (a second press queues nothing), and the answer is where it is.
 * Either way the work is `runAnalysis`.
 */
export async function requestAnalysis(auth: AuthContext, labId: string, sampleId: string, libraryVersionId: string): Promise<{ analysisId: string } | { run: AnalysisRun }> {
  return dataSource.transaction(async (manager) => {
    const lotCount = await timed('lot-count', () => includedLots(manager, labId, libraryVersionId));
    if (lotCount === null || lotCount <= config.jobs.analysisLots) return { analysisId: await runAnalysis(manager, auth, labId, sampleId, libraryVersionId) };
    // one request at a time per sample: the second press sees the first one's job; a sample locked
    // by a running job is answered without waiting for it
    const free: unknown[] = await manager.query('SELECT id FROM sample WHERE id = $1 AND lab_id = $2 FOR UPDATE SKIP LOCKED', [sampleId, labId]);
    if (!free.length) {
      const busy = await analysisRunOf(manager, labId, sampleId);
      if (busy.state === 'queued' || busy.state === 'running') return { run: busy };
      await findLabSample(manager, labId, sampleId, true);
    }
    const current = await analysisRunOf(manager, labId, sampleId);
    if (current.state === 'queued' || current.state === 'running') return { run: current };
    await enqueue(manager, 'analysis-run', { labId, sampleId, libraryVersionId, auth, requestedAt: new Date().toISOString() } satisfies AnalysisRunPayload, { singletonKey: sampleId });
    return { run: { sampleId, libraryVersionId, state: 'queued', lotCount, analysisId: null, detail: null } };
  });
}

/**
 * The job: runs the analysis once. A retry after the analysis was stored (a worker that died before
 * it could report) finds it and ends; a request the sample or library refuses (wrong state,
 * another product, a retired version) ends with the reason instead of retrying.
 */
export async function runRequestedAnalysis(payload: AnalysisRunPayload): Promise<{ analysisId?: string; refused?: string }> {
  const { labId, sampleId, libraryVersionId, auth, requestedAt } = payload;
  try {
    return await dataSource.transaction(async (manager) => {
      await findLabSample(manager, labId, sampleId, true);
      const [done]: Array<{ id: string }> = await manager.query(
        `SELECT id FROM analysis WHERE lab_id = $1 AND sample_id = $2 AND library_version_id = $3 AND analyst_user_id = $4 AND created_at >= $5 ORDER BY created_at DESC LIMIT 1`,
        [labId, sampleId, libraryVersionId, auth.userId, requestedAt],
      );
      if (done) return { analysisId: done.id };
      return { analysisId: await runAnalysis(manager, auth, labId, sampleId, libraryVersionId) };
    });
  } catch (err) {
    if (err instanceof ApiError && err.status < 500) return { refused: err.detail ?? err.message };
    throw err;
  }
}

/** Where the sample's latest analysis on a worker is (the analysis screen polls this while it waits). */
export async function analysisRunOf(manager: EntityManager, labId: string, sampleId: string): Promise<AnalysisRun> {
  await findLabSample(manager, labId, sampleId);
  const job = await latestJob(manager, 'analysis-run', sampleId);
  if (!job) return { sampleId, libraryVersionId: null, state: 'idle', lotCount: 0, analysisId: null, detail: null };
  const [row]: Array<{ data: AnalysisRunPayload }> = await manager.query(
    `SELECT data FROM pgboss.job WHERE id = $1 UNION ALL SELECT data FROM pgboss.archive WHERE id = $1 LIMIT 1`,
    [job.id],
  );
  const libraryVersionId = row?.data.libraryVersionId ?? null;
  const base = { sampleId, libraryVersionId, lotCount: libraryVersionId ? ((await includedLots(manager, labId, libraryVersionId)) ?? 0) : 0, analysisId: null, detail: null };
  const output = (job.output ?? {}) as { analysisId?: string; refused?: string; message?: string };
  switch (job.state) {
    case 'created':
    case 'retry':
      return { ...base, state: 'queued' };
    case 'active':
      return { ...base, state: 'running' };
    case 'completed':
      return output.refused ? { ...base, state: 'failed', detail: output.refused } : { ...base, state: 'done', analysisId: output.analysisId ?? null };
    default:
      // The worker's own error may name tables or constraints: it stays in the worker's log, under the job's id.
      return { ...base, state: 'failed', detail: `The analysis stopped after several attempts (job ${job.id}; the cause is in the worker's log). Run it again to retry.` };
  }
}
