import type { ReportPlots } from './report-data';

export interface HistogramBars {
  /** Right end of the axis: past the last bar and every marked value. */
  hi: number;
  edges: number[];
  counts: number[];
}

/**
 * The bars of the calibration-distance histogram: the analysis's own bins (what a report keeps),
 * or, for a report issued before reports kept bins, its full list of distances binned here.
 */
export function histogramBars(plots: ReportPlots, marks: readonly number[]): HistogramBars {
  const h = plots.calibrationHistogram;
  if (h && h.counts.length > 0 && h.binEdges.length === h.counts.length + 1) {
    const hi = Math.max(h.binEdges[h.binEdges.length - 1], ...marks.map((m) => m * 1.05), 1e-6);
    return { hi, edges: h.binEdges, counts: h.counts };
  }
  const d = (plots.calibrationDistances ?? []).filter((v) => Number.isFinite(v));
  const hi = Math.max(...d, ...marks, 1e-6) * 1.1;
  const bins = Math.max(5, Math.min(20, Math.ceil(Math.sqrt(d.length)) + 3));
  const width = hi / bins;
  const counts = new Array<number>(bins).fill(0);
  for (const v of d) counts[Math.min(bins - 1, Math.floor(v / width))]++;
  return { hi, edges: Array.from({ length: bins + 1 }, (_, i) => i * width), counts };
}
