import type { Express } from 'express';
import request from 'supertest';
import * as cpuPool from '../core/cpu-pool/cpu-pool';

export interface OffThreadProbe<T> {
  /** What `work` returned. */
  result: T;
  /** How many times the named task was handed to the CPU pool during `work`. */
  tasks: number;
  /** `/api/health` requests sent while one of those tasks was still running (each answered 200). */
  healthAnswersDuringTask: number;
  /** The longest the event loop went without running a 5 ms timer while `work` ran. */
  maxStallMs: number;
}

/**
 * A "does not block" check for work moved into the CPU pool: runs `work` (usually a request to the
 * app) and, the moment it hands the task `taskName` to the pool, asks `/api/health` again and again
 * until that task finishes. Work done on the event loop instead would hand no task over, and the
 * event loop's longest stall shows whether anything else held it. The event loop's longest stall is measured too, for
 * a generous bound in the test (not a timing of the work itself).
 */
export async function probeOffThread<T>(app: Express, taskName: Parameters<typeof cpuPool.runCpuTask>[0], work: () => Promise<T>): Promise<OffThreadProbe<T>> {
  const real = cpuPool.runCpuTask;
  let tasks = 0;
  let healthAnswersDuringTask = 0;
  const probes: Promise<void>[] = [];
  const spy = jest.spyOn(cpuPool, 'runCpuTask').mockImplementation(((name: string, input: unknown, options?: unknown) => {
    const running = (real as (n: string, i: unknown, o?: unknown) => Promise<unknown>)(name, input, options);
    if (name === taskName) {
      tasks += 1;
      let done = false;
      const finished = running.then(() => { done = true; }, () => { done = true; });
      probes.push((async () => {
        while (!done) {
          // counted when asked while the task runs: a short task may finish before the answer is back
          const res = await request(app).get('/api/health');
          if (res.status !== 200) throw new Error(`/api/health answered ${res.status} while ${name} ran`);
          healthAnswersDuringTask += 1;
        }
        await finished;
      })());
    }
    return running;
  }) as typeof cpuPool.runCpuTask);
  let last = performance.now();
  let maxStallMs = 0;
  const ticker = setInterval(() => {
    const now = performance.now();
    maxStallMs = Math.max(maxStallMs, now - last - 5);
    last = now;
  }, 5);
  try {
    const result = await work();
    await Promise.all(probes);
    return { result, tasks, healthAnswersDuringTask, maxStallMs };
  } finally {
    clearInterval(ticker);
    spy.mockRestore();
  }
}
