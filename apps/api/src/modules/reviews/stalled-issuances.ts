import { JOB_SCHEMA, failJob } from '../../core/jobs/jobs';
import { logger } from '../../core/logger';
import { dataSource } from '../../db/data-source';

/**
 * A worker that dies mid-issuance (killed, out of memory, its machine gone) leaves its job active,
 * and pg-boss would fail and retry it only when the queue's expiry passes (five minutes). The
 * issuing transaction holds the approval row locked from its first statement to its commit, so an
 * active issuance whose approval row no one holds is no longer being worked on: its transaction
 * ended with its connection (PostgreSQL rolled it back, and the number it had claimed goes to the
 * next issuance of the lab). Such a job is failed at once, so pg-boss retries it on any worker.
 *
 * A job that started less than `stalledAfterSeconds` ago is left alone (pg-boss has handed it out
 * but the handler may not have taken the lock yet). Failing a live job by mistake would cost a
 * retry and nothing else: the handler is idempotent (the retry waits for the approval row, then
 * finds the report issued). The job row is locked while it is failed, so two workers' sweeps
 * never fail the same attempt twice.
 */
export async function failStalledIssuances(stalledAfterSeconds: number): Promise<string[]> {
  const candidates: Array<{ id: string; lab_id: string; analysis_id: string }> = await dataSource.query(
    `SELECT id, data->>'labId' AS lab_id, data->>'analysisId' AS analysis_id FROM ${JOB_SCHEMA}.job
      WHERE name = 'report-issue' AND state = 'active' AND started_on < now() - make_interval(secs => $1)`,
    [stalledAfterSeconds],
  );
  const failed: string[] = [];
  for (const job of candidates) {
    const abandoned = await dataSource.transaction(async (m) => {
      const still: unknown[] = await m.query(`SELECT 1 FROM ${JOB_SCHEMA}.job WHERE name = 'report-issue' AND id = $1 AND state = 'active' FOR UPDATE SKIP LOCKED`, [job.id]);
      if (!still.length) return false;
      const [review]: Array<{ id: string }> = await m.query(
        `SELECT id FROM analysis_review WHERE lab_id = $1 AND analysis_id = $2 AND decision = 'approved' ORDER BY decided_at DESC LIMIT 1`,
        [job.lab_id, job.analysis_id],
      );
      // no approval at all: the handler fails on its own
      if (!review) return false;
      const free: unknown[] = await m.query('SELECT 1 FROM analysis_review WHERE id = $1 FOR UPDATE SKIP LOCKED', [review.id]);
      if (!free.length) return false;
      await failJob(m, 'report-issue', job.id, 'the worker issuing this report stopped before it finished; handed to another worker');
      return true;
    });
    if (abandoned) {
      logger.warn({ jobId: job.id, analysisId: job.analysis_id }, 'a report issuance whose worker stopped was handed on');
      failed.push(job.id);
    }
  }
  return failed;
}

/** Runs the sweep every few seconds in a worker process; `stop()` ends it (waiting for a sweep under way). */
export function startStalledIssuanceSweep(stalledAfterSeconds: number): { stop: () => Promise<void> } {
  const everyMs = Math.min(10_000, Math.max(500, (stalledAfterSeconds * 1000) / 2));
  let running: Promise<unknown> = Promise.resolve();
  const timer = setInterval(() => {
    running = running.then(() => failStalledIssuances(stalledAfterSeconds)).catch((err: unknown) => logger.warn({ err }, 'the stalled-issuance sweep failed; it tries again'));
  }, everyMs);
  timer.unref();
  return {
    stop: async () => {
      clearInterval(timer);
      await running;
    },
  };
}
