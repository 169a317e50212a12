/**
 * Bins for the distance histogram: the library's leave-one-out distances counted in equal bins
 * from 0 to just past the largest of them and the sample's distance, so every value has a bar
 * and the sample's line falls inside the plot. Square-root rule for the bin count (common practice).
 */
export function distanceHistogram(calibrationDistances: readonly number[], sampleDistance: number | null): { binEdges: number[]; counts: number[] } {
  const top = Math.max(...calibrationDistances, sampleDistance ?? 0) * 1.05 || 1;
  const bins = Math.min(30, Math.max(5, Math.ceil(Math.sqrt(calibrationDistances.length))));
  const width = top / bins;
  const binEdges = Array.from({ length: bins + 1 }, (_, i) => i * width);
  const counts = new Array<number>(bins).fill(0);
  for (const d of calibrationDistances) counts[Math.min(bins - 1, Math.floor(d / width))]++;
  return { binEdges, counts };
}
