import { AsyncLocalStorage } from 'node:async_hooks';
import { performance } from 'node:perf_hooks';

/**
 * Where the time of one report issuance goes, stage by stage (milliseconds, wall clock): the job's
 * wait for a worker, locking the approval, loading what the report says, claiming its number,
 * the render/sign task's wait for a thread, rendering, signing, storing, the client notice with
 * its e-mail jobs, credits, the rest of the transaction and its commit. The issuance job returns
 * them (pg-boss keeps them as the job's output) and logs them, and the jobs benchmark prints them.
 */
export type IssuanceStage =
  | 'pickup'
  | 'lockApproval'
  | 'loadData'
  | 'claimNumber'
  | 'loadCredential'
  | 'threadWait'
  | 'render'
  | 'sign'
  | 'store'
  | 'audit'
  | 'notify'
  | 'credits'
  | 'finish'
  | 'commit';

export type IssuanceStages = Partial<Record<IssuanceStage, number>> & { total?: number };

export class StageClock {
  readonly stages: IssuanceStages = {};
  private readonly started = performance.now();
  private last = this.started;

  /** Books the time since the previous lap (or the start) to `stage`. */
  lap(stage: IssuanceStage): void {
    const now = performance.now();
    this.add(stage, now - this.last);
    this.last = now;
  }

  /** Adds a duration measured elsewhere (e.g. inside a worker thread), moving the lap mark past it. */
  add(stage: IssuanceStage, ms: number): void {
    this.stages[stage] = round((this.stages[stage] ?? 0) + ms);
  }

  /** Splits the time since the last lap: `measured` stages first, the remainder to `rest`. */
  lapSplit(measured: Partial<Record<IssuanceStage, number>>, rest: IssuanceStage): void {
    const now = performance.now();
    let remaining = now - this.last;
    for (const [stage, ms] of Object.entries(measured) as Array<[IssuanceStage, number]>) {
      this.add(stage, ms);
      remaining -= ms;
    }
    this.add(rest, Math.max(0, remaining));
    this.last = now;
  }

  finish(): IssuanceStages {
    this.stages.total = round(performance.now() - this.started);
    return this.stages;
  }
}

function round(ms: number): number {
  return Math.round(ms * 10) / 10;
}

const current = new AsyncLocalStorage<StageClock>();

/** Runs `work` with `clock` as the issuance's stage clock (the steps below book their laps on it). */
export function withStageClock<T>(clock: StageClock, work: () => Promise<T>): Promise<T> {
  return current.run(clock, work);
}

/** The clock of the issuance running now, if it is being timed (an amendment is not). */
export function stageClock(): StageClock | undefined {
  return current.getStore();
}
