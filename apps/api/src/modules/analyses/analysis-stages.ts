import { performance } from 'node:perf_hooks';

/**
 * Where the time of one analysis goes, for the results benchmark: each stage of `runAnalysis`
 * reports its milliseconds to a listener, when one is set (none is, outside the benchmark, and
 * then a stage costs one comparison). The worker's own stages come back with its answer.
 */
export type StageListener = (stage: string, ms: number) => void;

let listener: StageListener | null = null;

/** Sets (or, with null, removes) the one listener. */
export function onAnalysisStage(next: StageListener | null): void {
  listener = next;
}

/** Runs `work` and reports its time as `stage`. */
export async function timed<T>(stage: string, work: () => Promise<T>): Promise<T> {
  if (!listener) return work();
  const t0 = performance.now();
  try {
    return await work();
  } finally {
    listener?.(stage, performance.now() - t0);
  }
}

/** Reports a time measured elsewhere (the worker thread's stages). */
export function reportStage(stage: string, ms: number): void {
  listener?.(stage, ms);
}
