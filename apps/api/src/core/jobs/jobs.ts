import PgBoss from 'pg-boss';
import { Client } from 'pg';
import type { EntityManager } from 'typeorm';
import { logger } from '../logger';
import { dataSource } from '../../db/data-source';

/**
 * Long work runs as jobs in PostgreSQL (pg-boss, schema `pgboss` in the app's own database): an API
 * process only records a request and enqueues it, in the same transaction; worker processes
 * (`worker.ts`) do the work. Any number of API and worker processes may share one database.
 */
export type JobName = 'report-issue' | 'email-send' | 'library-publish' | 'analysis-run';

export interface QueueSettings {
  /** pg-boss policy: `stately` keeps at most one waiting and one running job per singleton key. */
  policy: 'standard' | 'stately';
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
  /** A job running longer (a crashed worker) is failed by the supervisor and retried. */
  expireInSeconds: number;
  /** Jobs of this queue one worker process runs at a time. */
  concurrency: number;
}

export const QUEUES: Record<JobName, QueueSettings> = {
  'report-issue': { policy: 'stately', retryLimit: 6, retryDelay: 5, retryBackoff: true, expireInSeconds: 300, concurrency: 4 },
  'email-send': { policy: 'standard', retryLimit: 2, retryDelay: 30, retryBackoff: true, expireInSeconds: 120, concurrency: 2 },
  'library-publish': { policy: 'stately', retryLimit: 3, retryDelay: 10, retryBackoff: true, expireInSeconds: 1800, concurrency: 1 },
  'analysis-run': { policy: 'stately', retryLimit: 3, retryDelay: 5, retryBackoff: true, expireInSeconds: 900, concurrency: 1 },
};

/** The channel an enqueue notifies on commit, so an idle worker fetches at once instead of at its next poll. */
const WAKE_CHANNEL = 'ohmprint_jobs';
export const JOB_SCHEMA = 'pgboss';

export interface JobInfo {
  id: string;
  retryCount: number;
  /** Milliseconds from the job's creation (or its retry's due time) until this worker took it. */
  pickupMs: number;
}

export type JobHandler = (payload: Record<string, unknown>, job: JobInfo) => Promise<unknown>;

export interface StartJobsOptions {
  /** Handlers to run in this process (a worker); none for an API process that only enqueues. */
  handlers?: Partial<Record<JobName, JobHandler>>;
  /** Maintenance (expiring stuck jobs, retries, archiving): worker processes only. */
  supervise?: boolean;
  /** How often an idle worker polls when no wake-up arrives. */
  pollingIntervalSeconds?: number;
  /** Connections pg-boss may open (raised to one for each job worker plus one, so no fetch waits for a connection). */
  maxConnections?: number;
}

let boss: PgBoss | null = null;
let listener: Client | null = null;
/** Job handlers of this process that are running now (stopJobs waits for them to end). */
let handlersRunning = 0;
const workersByQueue = new Map<JobName, string[]>();

function connectionOptions(): { host?: string; port?: number; user?: string; password?: string; database?: string } {
  const o = dataSource.options as { host?: string; port?: number; username?: string; password?: unknown; database?: string };
  return { host: o.host, port: o.port, user: o.username, password: o.password as string, database: o.database };
}

/** Installs or upgrades pg-boss's schema and creates the queues (idempotent; `npm run db:migrate` runs it). */
export async function installJobSchema(): Promise<void> {
  const installer = new PgBoss({ ...connectionOptions(), schema: JOB_SCHEMA, max: 2, supervise: false, schedule: false, application_name: 'ohmprint-jobs-install' });
  installer.on('error', (err) => logger.error({ err }, 'job schema install'));
  await installer.start();
  try {
    await createQueues(installer);
  } finally {
    await installer.stop({ graceful: false, wait: true });
  }
}

async function createQueues(b: PgBoss): Promise<void> {
  for (const [name, q] of Object.entries(QUEUES)) {
    if (await b.getQueue(name)) continue;
    try {
      await b.createQueue(name, { name, policy: q.policy, retryLimit: q.retryLimit, retryDelay: q.retryDelay, retryBackoff: q.retryBackoff, expireInSeconds: q.expireInSeconds });
    } catch (err) {
      // another process created it at the same moment
      if (!(await b.getQueue(name))) throw err;
    }
  }
}

/** Starts pg-boss on the app's database (after `dataSource.initialize()`), and the given handlers. */
export async function startJobs(options: StartJobsOptions = {}): Promise<void> {
  if (boss) return;
  const handlers = Object.entries(options.handlers ?? {}) as Array<[JobName, JobHandler]>;
  // A connection for every worker's fetch and one to spare: a fetch left waiting for a connection
  // when the stop closes the pool waits for ever (pg-pool serves no queued request once ending),
  // and that worker's loop never ends.
  const workerCount = handlers.reduce((n, [name]) => n + QUEUES[name].concurrency, 0);
  const b = new PgBoss({
    ...connectionOptions(),
    schema: JOB_SCHEMA,
    max: Math.max(options.maxConnections ?? 4, workerCount + 1),
    supervise: options.supervise ?? false,
    schedule: false,
    application_name: 'ohmprint-jobs',
  });
  b.on('error', (err) => logger.error({ err }, 'job system error'));
  await b.start();
  await createQueues(b);
  boss = b;
  for (const [name, handler] of handlers) {
    const ids: string[] = [];
    for (let i = 0; i < QUEUES[name].concurrency; i++) {
      ids.push(
        await b.work<Record<string, unknown>>(name, { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2, batchSize: 1, includeMetadata: true }, async ([job]) => {
          const started = Date.now();
          handlersRunning += 1;
          try {
            const due = Math.max(new Date(job.createdOn).getTime(), new Date(job.startAfter).getTime() || 0);
            const result = await handler(job.data, { id: job.id, retryCount: job.retryCount, pickupMs: Math.max(0, started - due) });
            logger.info({ queue: name, jobId: job.id, ms: Date.now() - started }, 'job done');
            return result;
          } catch (err) {
            logger.warn({ queue: name, jobId: job.id, err }, 'job failed (retried while attempts remain)');
            throw err;
          } finally {
            handlersRunning -= 1;
          }
        }),
      );
    }
    workersByQueue.set(name, ids);
  }
  if (handlers.length) {
    listener = new Client({ ...connectionOptions(), application_name: 'ohmprint-jobs-wake' });
    listener.on('error', (err) => logger.warn({ err }, 'job wake-up connection lost; polling continues'));
    listener.on('notification', (n) => {
      for (const id of workersByQueue.get(n.payload as JobName) ?? []) b.notifyWorker(id);
    });
    await listener.connect();
    await listener.query(`LISTEN ${WAKE_CHANNEL}`);
  }
}

/** Stops fetching, lets running jobs finish (up to `timeoutSeconds`), closes connections. */
export async function stopJobs(timeoutSeconds = 20): Promise<void> {
  const b = boss;
  boss = null;
  workersByQueue.clear();
  await listener?.end().catch(() => undefined);
  listener = null;
  if (!b) return;
  await b.stop({ graceful: true, wait: true, timeout: timeoutSeconds * 1000 });
  // pg-boss checks its workers once a second until each has left its loop: a worker that was
  // fetching, or a job still running when the stop timed out, keeps that check (and its timers)
  // going after stop() resolves. Wait for our handlers, then one more check, so nothing of the job
  // system runs after the caller moves on (a test file's teardown, a process exit).
  const until = Date.now() + timeoutSeconds * 1000;
  while (handlersRunning > 0 && Date.now() < until) await new Promise((r) => setTimeout(r, 50));
  await new Promise((r) => setTimeout(r, 1100));
}

export interface EnqueueOptions {
  /** At most one waiting and one running job per key (stately queues): a second enqueue is a no-op. */
  singletonKey?: string;
  startAfter?: Date | number;
}

/**
 * Enqueues a job. With `manager`, inside the caller's transaction: the job exists only if the
 * change that asks for it commits, and workers are woken at commit. Returns the job id, or null
 * when a job with the same singleton key is already waiting.
 */
export async function enqueue(manager: EntityManager | null, name: JobName, payload: Record<string, unknown>, options: EnqueueOptions = {}): Promise<string | null> {
  if (!boss) throw new Error(`jobs are not started in this process (enqueue ${name})`);
  const db = manager ? { executeSql: async (text: string, values: unknown[]) => ({ rows: toRows(await manager.query(text, values)) }) } : undefined;
  const id = await boss.send(name, payload, { singletonKey: options.singletonKey, startAfter: options.startAfter as Date | undefined, db });
  const wake = `SELECT pg_notify('${WAKE_CHANNEL}', $1)`;
  if (manager) await manager.query(wake, [name]);
  else await dataSource.query(wake, [name]);
  return id;
}

/**
 * Fails a job inside the caller's transaction, as if its handler had thrown: pg-boss retries it
 * (on any worker, after the queue's retry delay) while attempts remain.
 */
export async function failJob(manager: EntityManager, name: JobName, id: string, message: string): Promise<void> {
  if (!boss) throw new Error(`jobs are not started in this process (fail ${name})`);
  const db = { executeSql: async (text: string, values: unknown[]) => ({ rows: toRows(await manager.query(text, values)) }) };
  await boss.fail(name, id, { message }, { db });
}

/** TypeORM answers an INSERT … RETURNING with its rows, an UPDATE with [rows, count]. */
function toRows(result: unknown): unknown[] {
  if (Array.isArray(result) && result.length === 2 && Array.isArray(result[0]) && typeof result[1] === 'number') return result[0];
  return Array.isArray(result) ? result : [];
}

export type JobState = 'created' | 'retry' | 'active' | 'completed' | 'cancelled' | 'failed';

/** The newest job of a queue with this singleton key (waiting, running, done or failed), or null. */
export async function latestJob(manager: EntityManager, name: JobName, singletonKey: string): Promise<{ id: string; state: JobState; output: unknown } | null> {
  const rows: Array<{ id: string; state: JobState; output: unknown }> = await manager.query(
    `SELECT id, state, output FROM (
       SELECT id, state, output, created_on FROM ${JOB_SCHEMA}.job WHERE name = $1 AND singleton_key = $2
       UNION ALL SELECT id, state, output, created_on FROM ${JOB_SCHEMA}.archive WHERE name = $1 AND singleton_key = $2
     ) j ORDER BY created_on DESC LIMIT 1`,
    [name, singletonKey],
  );
  return rows[0] ?? null;
}

/** Jobs not yet finished in this database (tests wait for zero). */
export async function unfinishedJobs(manager: EntityManager, names: JobName[]): Promise<number> {
  const [{ n }]: Array<{ n: number }> = await manager.query(`SELECT count(*)::int AS n FROM ${JOB_SCHEMA}.job WHERE name = ANY($1) AND state IN ('created', 'retry', 'active')`, [names]);
  return n;
}

export function jobsStarted(): boolean {
  return boss !== null;
}
