import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { packLibrary } from '../libraries/library-packing';
import type { PublishedLibrary } from '../libraries/published-library';
import type { Replicate } from '../measurements/replicate.entity';
import type { ComputedAnalysis } from './compute-analysis';
import type { OtherLibrary } from './does-not-belong';

/**
 * `computeAnalysis` in a worker thread: the fit, distances and map of one sample never hold up
 * other requests. The raw files stay behind (the computation reads only the parsed points), and
 * the libraries cross packed: their spectra are shared with the thread, not copied.
 */
export function analyseOffThread(replicates: readonly Replicate[], library: PublishedLibrary, others: readonly OtherLibrary[] = []): Promise<ComputedAnalysis> {
  const light = replicates.map((r) => ({ ...r, rawFile: Buffer.alloc(0) }) as Replicate);
  return runCpuTask('analyse', { replicates: light, library: packLibrary(library), others: others.map((o) => ({ ...o, library: packLibrary(o.library) })) });
}
