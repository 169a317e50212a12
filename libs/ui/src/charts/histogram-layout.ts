import { scaleLinear } from 'd3-scale';
import { estimateTextWidth, placeLabels, type LabelSide, type PlacedLabel } from '@ohmprint/contracts';
import { linearTicks } from './axis-ticks';
import type { AxisTick, PlotArea } from './chart-types';
import { formatNumber } from './si-format';

export interface HistogramBin {
  readonly from: number;
  readonly to: number;
  readonly count: number;
}

/**
 * Counts per bin with numpy.histogram's convention: every bin half-open [from, to) except the
 * last, which also holds its right edge. Values outside the edges are not counted.
 */
export function histogramCounts(values: ArrayLike<number>, edges: readonly number[]): HistogramBin[] {
  const bins = edges.slice(1).map((to, i) => ({ from: edges[i], to, count: 0 }));
  const last = bins.length - 1;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (!Number.isFinite(v) || v < edges[0] || v > edges[edges.length - 1]) continue;
    // Binary search for the bin whose left edge is the last one ≤ v.
    let lo = 0;
    let hi = last;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (edges[mid] <= v) lo = mid;
      else hi = mid - 1;
    }
    bins[lo].count++;
  }
  return bins;
}

/** Sturges' rule, ⌈log₂ n⌉ + 1 bins, for the small samples a reference library gives. */
export function sturgesBinCount(n: number): number {
  return n <= 1 ? 1 : Math.ceil(Math.log2(n)) + 1;
}

export interface DistanceHistogramInput {
  /** The library's calibration distances (each lot's leave-one-out nearest distance). */
  readonly calibrationDistances: ArrayLike<number>;
  readonly t95: number | null;
  readonly t99: number | null;
  /** The sample's distance to its nearest reference lot, if an analysis has one. */
  readonly sampleDistance: number | null;
  /** Bins the API already counted; when given they are drawn as they are, not re-binned. */
  readonly bins?: { readonly binEdges: readonly number[]; readonly counts: readonly number[] };
}

export interface DistanceHistogramLayout {
  readonly width: number;
  readonly height: number;
  readonly area: PlotArea;
  readonly bars: readonly (HistogramBin & { readonly x: number; readonly y: number; readonly w: number; readonly h: number })[];
  readonly xTicks: readonly AxisTick[];
  readonly yTicks: readonly AxisTick[];
  readonly lines: readonly HistogramLine[];
}

export interface HistogramLine {
  readonly kind: 't95' | 't99' | 'sample';
  readonly x: number;
  readonly label: string;
  /** Where its label goes: never over another line's label, never outside the chart. */
  readonly labelBox: PlacedLabel;
}

/** Chart text is 11 px (chart-svg.css); a label box is one line of it with a little air. */
export const CHART_FONT_PX = 11;
export const LABEL_BOX_HEIGHT = 14;
/** The SVG baseline of text drawn in a label box, from the box's top. */
export const LABEL_BASELINE = 10.5;

const MARGIN = { left: 48, right: 16, top: 28, bottom: 40 };

/**
 * Bars of the calibration distances on nice edges from 0, with vertical lines for T95, T99 and
 * the sample. The axis always reaches the sample so a far outlier is still on the chart.
 */
export function distanceHistogramLayout(input: DistanceHistogramInput, width: number, height: number): DistanceHistogramLayout {
  const area: PlotArea = {
    left: MARGIN.left,
    top: MARGIN.top,
    width: width - MARGIN.left - MARGIN.right,
    height: height - MARGIN.top - MARGIN.bottom,
  };
  const values = Array.from(input.calibrationDistances).filter(Number.isFinite);
  const given = input.bins && input.bins.binEdges.length === input.bins.counts.length + 1 ? input.bins : null;
  const reach = Math.max(...values, ...(given?.binEdges ?? []), input.t95 ?? 0, input.t99 ?? 0, input.sampleDistance ?? 0, 1e-9);
  const binTarget = Math.max(5, sturgesBinCount(given ? given.counts.reduce((a, b) => a + b, 0) : values.length));
  const x = scaleLinear().domain([0, reach]).range([area.left, area.left + area.width]).nice(binTarget);
  let bins: HistogramBin[];
  if (given) {
    bins = given.counts.map((count, i) => ({ from: given.binEdges[i], to: given.binEdges[i + 1], count }));
  } else {
    const edges = x.ticks(binTarget);
    const top = x.domain()[1];
    if (edges[edges.length - 1] < top) edges.push(top);
    bins = histogramCounts(values, edges);
  }
  const maxCount = Math.max(1, ...bins.map((b) => b.count));
  const y = scaleLinear().domain([0, maxCount]).range([area.top + area.height, area.top]).nice();
  const raw: { kind: 't95' | 't99' | 'sample'; x: number; label: string }[] = [];
  if (input.t95 !== null) raw.push({ kind: 't95', x: x(input.t95), label: `T95 ${formatNumber(input.t95, 3)}` });
  if (input.t99 !== null) raw.push({ kind: 't99', x: x(input.t99), label: `T99 ${formatNumber(input.t99, 3)}` });
  if (input.sampleDistance !== null) {
    raw.push({ kind: 'sample', x: x(input.sampleDistance), label: `Sample ${formatNumber(input.sampleDistance, 3)}` });
  }
  // Labels sit in the band above the plot, T95 to the left of its line and the others to the right;
  // at an edge they flip, and when lines stand close together they stack down beside their lines.
  // The sample's label is placed first: it is the one a reader looks for.
  const order = [...raw].sort((a, b) => (a.kind === 'sample' ? -1 : b.kind === 'sample' ? 1 : 0));
  const sidesOf = (kind: string): LabelSide[] => (kind === 't95' ? ['left', 'right'] : ['right', 'left']);
  const boxes = placeLabels(
    order.map((l) => ({
      id: l.kind,
      anchor: { x: l.x, y: area.top - 4 - LABEL_BOX_HEIGHT / 2 },
      width: estimateTextWidth(l.label, CHART_FONT_PX, l.kind === 'sample'),
      height: LABEL_BOX_HEIGHT,
      sides: sidesOf(l.kind),
    })),
    { x: 0, y: 0, width, height: area.top + area.height },
    { gap: 3 },
  );
  const lines: HistogramLine[] = raw.map((l) => ({ ...l, labelBox: boxes.find((b) => b.id === l.kind)! }));
  return {
    width,
    height,
    area,
    bars: bins.map((b) => ({
      ...b,
      x: x(b.from) + 1,
      w: Math.max(0, x(b.to) - x(b.from) - 2),
      y: y(b.count),
      h: y(0) - y(b.count),
    })),
    xTicks: linearTicks(x, binTarget, (v) => formatNumber(v, 3)),
    // Counts are whole numbers: drop fractional ticks d3 may offer for small maxima.
    yTicks: linearTicks(y, Math.min(5, y.domain()[1])).filter((t) => Number.isInteger(Number(t.label))),
    lines,
  };
}
