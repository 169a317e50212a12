export interface DistanceHistogram {
  binEdges: number[];
  counts: number[];
  t95: number | null;
  t99: number | null;
  sampleDistance: number | null;
  /** Index of the bin the sample's distance falls in (same rule as the counts), null without one. */
  sampleBin: number | null;
}

/**
 * Bins for the distance histogram: the library's leave-one-out distances counted in equal bins
 * from 0 to just past the largest of them and the sample's distance, so every value has a bar
 * and the sample's line falls inside the plot. Square-root rule for the bin count (common practice),
 * at most 30 bars. Bins are half-open [from, to) except the last, which also takes its right edge
 * (numpy.histogram's convention). The thresholds ride along so a reader draws the plot from this alone.
 */
export function distanceHistogram(calibrationDistances: ArrayLike<number>, sampleDistance: number | null, t95: number | null = null, t99: number | null = null): DistanceHistogram {
  let largest = sampleDistance ?? 0;
  for (let i = 0; i < calibrationDistances.length; i++) if (calibrationDistances[i] > largest) largest = calibrationDistances[i];
  const top = largest * 1.05 || 1;
  const bins = Math.min(30, Math.max(5, Math.ceil(Math.sqrt(calibrationDistances.length))));
  const width = top / bins;
  const binEdges = Array.from({ length: bins + 1 }, (_, i) => i * width);
  const counts = new Array<number>(bins).fill(0);
  const binOf = (d: number) => Math.min(bins - 1, Math.floor(d / width));
  for (let i = 0; i < calibrationDistances.length; i++) counts[binOf(calibrationDistances[i])]++;
  return { binEdges, counts, t95, t99, sampleDistance, sampleBin: sampleDistance === null ? null : binOf(sampleDistance) };
}
