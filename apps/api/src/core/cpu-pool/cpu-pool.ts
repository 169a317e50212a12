import type { TransferListItem } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { extname, join } from 'node:path';
import { Piscina } from 'piscina';
import { config } from '../../config';
import { ApiError } from '../api-error';
import type * as Tasks from './cpu-tasks';

type TaskName = Exclude<keyof typeof Tasks, 'TaskRefusal' | 'ExportFile' | 'ParsedExport' | 'SpectrumLiterals' | 'StandardRunReading' | 'transferredBytes' | 'CALIBRATION_PROGRESS_MS'>;
type TaskInput<N extends TaskName> = Parameters<(typeof Tasks)[N]>[0];
type TaskOutput<N extends TaskName> = Awaited<ReturnType<(typeof Tasks)[N]>>;

/**
 * Worker threads for the API's CPU-heavy work (password hashing, file parsing, analysis and
 * calibration, report rendering and signing), so the event loop keeps answering every tenant
 * while one of them uploads or issues. Sized for the two-core machine by default
 * (`CPU_WORKERS`). Compiled, the tasks are `cpu-tasks.js` beside this file; under ts-jest or tsx
 * (a `.ts` file here) the threads load a small CommonJS shim that compiles `cpu-tasks.ts` with tsx.
 */
let pool: Piscina | undefined;

function workerFile(): string {
  return extname(__filename) === '.ts' ? join(__dirname, 'cpu-tasks-ts.cjs') : join(__dirname, 'cpu-tasks.js');
}

/**
 * One thread fewer than the machine has cores (at most two, at least one), so the event loop
 * always keeps a core to itself: on two cores a flood of sign-ins or uploads fills one worker
 * while health checks, lists and every other tenant's requests are answered on the other.
 */
export function cpuWorkerCount(): number {
  return config.cpuWorkers ?? (wholeMachine ? Math.max(1, availableParallelism()) : Math.max(1, Math.min(2, availableParallelism() - 1)));
}

let wholeMachine = false;

/**
 * A job worker process answers no requests, so its pool may use every core (four reports render
 * and sign side by side on two cores instead of one after another). Call before the first task;
 * `CPU_WORKERS` still wins when set.
 */
export function useEveryCoreForCpuTasks(): void {
  wholeMachine = true;
}

function thePool(): Piscina {
  pool ??= new Piscina({
    filename: workerFile(),
    // a job worker keeps every thread (warm, see warmThreadsForReports); the API starts one and adds on demand
    minThreads: wholeMachine ? cpuWorkerCount() : 1,
    maxThreads: cpuWorkerCount(),
    idleTimeout: 60_000,
    // Queued tasks wait their turn rather than starting more threads than cores.
    concurrentTasksPerWorker: 1,
  });
  return pool;
}

/**
 * Runs one task in a worker thread; a refusal the task returned becomes the same ApiError here.
 * `queueLimit`: refuse at once (503 with Retry-After) when that many tasks already wait, rather
 * than queue without bound (sign-ins use it, so a flood cannot build a backlog of hashes).
 * `transferList`: buffers of `input` moved to the thread rather than copied (unusable here after).
 */
export async function runCpuTask<N extends TaskName>(name: N, input: TaskInput<N>, options: { queueLimit?: number; transferList?: TransferListItem[] } = {}): Promise<Exclude<TaskOutput<N>, Tasks.TaskRefusal>> {
  if (options.queueLimit !== undefined && thePool().queueSize >= options.queueLimit) {
    throw new ApiError(503, 'Busy', 'The server is checking many passwords at the moment; try again in a few seconds.', { type: 'busy', headers: { 'Retry-After': '2' } });
  }
  const result = (await thePool().run(input, { name, transferList: options.transferList })) as TaskOutput<N>;
  if (result && typeof result === 'object' && 'refused' in result) {
    const r = (result as Tasks.TaskRefusal).refused;
    throw new ApiError(r.status, r.title, r.detail, { type: r.type === 'about:blank' ? undefined : r.type, errors: r.errors, headers: r.headers, extensions: r.extensions });
  }
  return result as Exclude<TaskOutput<N>, Tasks.TaskRefusal>;
}

/**
 * Has every thread load the report renderer and render the demo report once (a job worker at
 * start), so no approval pays for a cold thread: loading the PDF modules, parsing the fonts and
 * laying out the report's words the first time costs about a second of CPU per thread.
 */
export async function warmThreadsForReports(): Promise<number[]> {
  // each warm-up keeps its thread busy for a while, so the tasks spread over the threads
  return Promise.all(Array.from({ length: cpuWorkerCount() }, () => runCpuTask('warmReportRenderer', undefined as never)));
}

/** Tasks waiting for a free thread and the threads running, for the benchmark and health figures. */
export function cpuPoolLoad(): { queued: number; threads: number } {
  return { queued: pool?.queueSize ?? 0, threads: pool?.threads.length ?? 0 };
}

/** Stops the threads (graceful shutdown, end of a test file). */
export async function closeCpuPool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
