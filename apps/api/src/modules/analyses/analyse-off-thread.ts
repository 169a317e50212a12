import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import type { AnalysedInWorker } from '../../core/cpu-pool/cpu-tasks';
import { config } from '../../config';
import { libraryRef, packLibrary, type LibraryHandOver } from '../libraries/library-packing';
import type { PublishedLibrary } from '../libraries/published-library';
import type { Replicate } from '../measurements/replicate.entity';
import type { OtherLibrary } from './does-not-belong';
import { reportStage } from './analysis-stages';

export type { AnalysedInWorker };

/**
 * `computeAnalysis` in a worker thread: the fit, distances and map of one sample never hold up
 * other requests. The raw files stay behind (the computation reads only the parsed points). Each
 * library is first named only (version, lab, load, lot count): a thread that keeps it answers at
 * once; one that does not says which it lacks, and those are sent whole (their spectra shared, not
 * copied) and kept there for the next analyses. Every lot's distance comes back packed, by transfer.
 * `lotOrder` also returns every lot's distance in lot order (reproduce compares them).
 */
export async function analyseOffThread(replicates: readonly Replicate[], library: PublishedLibrary, others: readonly OtherLibrary[] = [], options: { lotOrder?: boolean } = {}): Promise<AnalysedInWorker> {
  const light = replicates.map((r) => ({ ...r, rawFile: Buffer.alloc(0) }) as Replicate);
  const send = (whole: ReadonlySet<string>) => {
    const handOver = (l: PublishedLibrary): LibraryHandOver => (whole.has(l.versionId) ? packLibrary(l) : libraryRef(l));
    return runCpuTask('analyse', {
      replicates: light,
      library: handOver(library),
      others: others.map((o) => ({ ...o, library: handOver(o.library) })),
      keepBytes: config.libraryCacheMaxBytes,
      lotOrder: options.lotOrder,
    });
  };
  let answer = await send(new Set());
  if ('missing' in answer) {
    reportStage('worker-missing', 1);
    answer = await send(new Set(answer.missing));
    // sent whole, nothing can be missing; a thread never answers so, but say so plainly if it did
    if ('missing' in answer) throw new Error(`the analysis worker lacks libraries it was sent whole: ${answer.missing.join(', ')}`);
  }
  for (const [stage, ms] of Object.entries(answer.workerMs)) reportStage(`worker-${stage}`, ms);
  return answer;
}
