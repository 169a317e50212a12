import type { EntityManager } from 'typeorm';
import type { LibraryPublication, LibraryPublicationProgress, LibraryPublicationStage } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { enqueue, latestJob } from '../../core/jobs/jobs';
import { config } from '../../config';
import { dataSource } from '../../db/data-source';
import { LibraryVersion } from './library-version.entity';
import { publishVersion } from './library-versions';

export interface LibraryPublishPayload {
  labId: string;
  versionId: string;
  userId: string;
}

async function includedLots(manager: EntityManager, labId: string, versionId: string): Promise<number> {
  const [{ n }]: Array<{ n: number }> = await manager.query('SELECT count(*)::int AS n FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included', [versionId, labId]);
  return n;
}

/**
 * A reviewer or lab admin asks to publish a draft. Up to `LIBRARY_PUBLISH_JOB_LOTS` included lots it
 * is published at once (`published`); above, a `library-publish` job is queued (one waiting job per
 * version: a second press while it waits queues nothing) and the answer says `queued`. Either way
 * the work is `publishVersion`.
 */
export async function requestPublication(labId: string, versionId: string, userId: string): Promise<{ queued: boolean; publication: LibraryPublication }> {
  return dataSource.transaction(async (manager) => {
    const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId }, lock: { mode: 'pessimistic_write', onLocked: 'skip_locked' } });
    if (!version) {
      // Locked: a worker (or another person's press) is publishing it right now.
      const busy = await manager.findOne(LibraryVersion, { where: { id: versionId, labId } });
      if (!busy) throw ApiError.notFound('Library version');
      return { queued: true, publication: { versionId, version: busy.version, state: 'running', lotCount: await includedLots(manager, labId, versionId), detail: null } };
    }
    if (version.status !== 'draft') throw ApiError.conflict(`Version ${version.version} is already ${version.status}.`);
    const lotCount = await includedLots(manager, labId, versionId);
    if (lotCount <= config.jobs.libraryPublishLots) {
      await publishVersion(manager, labId, versionId, userId);
      return { queued: false, publication: { versionId, version: version.version, state: 'published', lotCount, detail: null } };
    }
    const current = await publicationState(manager, labId, version, lotCount);
    if (current.state !== 'queued' && current.state !== 'running') {
      // A new attempt starts from nothing: an earlier attempt's figure is not shown for it.
      await manager.query(`DELETE FROM library_publication_progress WHERE library_version_id = $1 AND lab_id = $2`, [versionId, labId]);
      await enqueue(manager, 'library-publish', { labId, versionId, userId } satisfies LibraryPublishPayload, { singletonKey: versionId });
    }
    return { queued: true, publication: { ...current, state: current.state === 'running' ? 'running' : 'queued', detail: null } };
  });
}

/**
 * The job: publishes the draft once. The version row is locked while it runs and the job ends at
 * once when the version is no longer a draft, so a retry or a second job publishes (and audits)
 * nothing twice. A draft the method refuses (too few lots, no thresholds, an interval too wide) ends
 * the job with the reason instead of retrying it.
 */
export async function publishLibraryVersion(payload: LibraryPublishPayload): Promise<{ published: boolean; refused?: string }> {
  const { labId, versionId, userId } = payload;
  const progress = publicationProgressWriter(labId, versionId);
  try {
    return await dataSource.transaction(async (manager) => {
      const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId }, lock: { mode: 'pessimistic_write' } });
      if (!version) return { published: false, refused: 'The version no longer exists.' };
      if (version.status !== 'draft') return { published: false };
      await publishVersion(manager, labId, versionId, userId, progress.lots, () => progress.stage('storing'));
      return { published: true };
    });
  } catch (err) {
    if (err instanceof ApiError && err.status === 409) return { published: false, refused: err.detail ?? err.message };
    throw err;
  } finally {
    await progress.finished();
  }
}

/** How often a running publication writes how far it is (the library screen polls about as often). */
export const PROGRESS_WRITE_MS = 500;

/**
 * Writes a publication's progress through the pool, not the job's transaction (which holds the
 * version's lock until the end, so nothing it writes is seen before then): the lots compared at
 * most every PROGRESS_WRITE_MS, each stage change at once, one write at a time. The job never
 * waits for a write until it has ended (the table has no key on the locked version row either).
 */
function publicationProgressWriter(labId: string, versionId: string) {
  let writing: Promise<void> = Promise.resolve();
  let pending: { stage: LibraryPublicationStage; lotsDone: number; lotCount: number } | null = null;
  let last = { stage: '' as string, at: 0, lotCount: 0 };
  const write = (next: { stage: LibraryPublicationStage; lotsDone: number; lotCount: number }, force: boolean): Promise<void> => {
    const now = Date.now();
    if (!force && next.stage === last.stage && now - last.at < PROGRESS_WRITE_MS) return writing;
    last = { stage: next.stage, at: now, lotCount: next.lotCount };
    // Only the newest figure waits while a write is under way.
    const queued = pending === null;
    pending = next;
    if (!queued) return writing;
    writing = writing.then(async () => {
      const row = pending!;
      pending = null;
      await dataSource
        .query(
          `INSERT INTO library_publication_progress (library_version_id, lab_id, stage, lots_done, lot_count, updated_at) VALUES ($1, $2, $3, $4, $5, now())
           ON CONFLICT (library_version_id) DO UPDATE SET stage = EXCLUDED.stage, lots_done = EXCLUDED.lots_done, lot_count = EXCLUDED.lot_count, updated_at = now()`,
          [versionId, labId, row.stage, row.lotsDone, row.lotCount],
        )
        .catch(() => undefined); // progress is a courtesy: never fail the publication for it
    });
    return writing;
  };
  return {
    lots: (lotsDone: number, lotCount: number) => {
      const done = lotsDone >= lotCount;
      void write({ stage: done ? 'estimating-thresholds' : 'comparing-lots', lotsDone, lotCount }, done || last.stage === '');
    },
    stage: (stage: LibraryPublicationStage) => void write({ stage, lotsDone: last.lotCount, lotCount: last.lotCount }, true),
    /** After the job: the last write done. The row stays until the next press (a finished job's state speaks from here). */
    finished: () => writing,
  };
}

async function publicationState(manager: EntityManager, labId: string, version: LibraryVersion, lotCount: number): Promise<LibraryPublication> {
  const base = { versionId: version.id, version: version.version, lotCount };
  if (version.status !== 'draft') return { ...base, state: 'published', detail: null };
  const job = await latestJob(manager, 'library-publish', version.id);
  if (!job) return { ...base, state: 'draft', detail: null };
  const output = (job.output ?? {}) as { refused?: string };
  switch (job.state) {
    case 'created':
    case 'retry':
      return { ...base, state: 'queued', detail: null };
    case 'active': {
      const progress = await publicationProgress(manager, labId, version.id);
      return { ...base, state: 'running', detail: null, ...(progress ? { progress } : {}) };
    }
    case 'completed': {
      if (output.refused) return { ...base, state: 'failed', detail: output.refused };
      // The job is marked completed only after its publishing transaction committed: a version read
      // as a draft a moment before that commit is read again, so a finished publication never shows as a draft.
      const now = await manager.findOne(LibraryVersion, { where: { id: version.id, labId } });
      return now && now.status !== 'draft' ? { ...base, state: 'published', detail: null } : { ...base, state: 'draft', detail: null };
    }
    default:
      return {
        ...base,
        state: 'failed',
        // The worker's own error may name tables or constraints: it stays in the worker's log, under the job's id.
        detail: `Publishing stopped after several attempts (job ${job.id}; the cause is in the worker's log). Press publish to try again.`,
      };
  }
}

async function publicationProgress(manager: EntityManager, labId: string, versionId: string): Promise<LibraryPublicationProgress | null> {
  const [row]: Array<{ stage: LibraryPublicationStage; lots_done: number; lot_count: number; updated_at: Date }> = await manager.query(
    `SELECT stage, lots_done, lot_count, updated_at FROM library_publication_progress WHERE library_version_id = $1 AND lab_id = $2`,
    [versionId, labId],
  );
  return row ? { stage: row.stage, lotsDone: row.lots_done, lotCount: row.lot_count, updatedAt: row.updated_at.toISOString() } : null;
}

/** Where a version's publication is (the library screen polls this while it waits). */
export async function publicationOf(manager: EntityManager, labId: string, versionId: string): Promise<LibraryPublication> {
  const version = await manager.findOne(LibraryVersion, { where: { id: versionId, labId } });
  if (!version) throw ApiError.notFound('Library version');
  return publicationState(manager, labId, version, await includedLots(manager, labId, versionId));
}
