import { estimateTextWidth, placeLabels, type PlacedLabel } from '@ohmprint/contracts';
import { linearTicks } from './axis-ticks';
import type { PlotArea, ReferenceBand, SpectrumSeries } from './chart-types';
import { convexHull } from './convex-hull';
import { equalAspectScales, finiteExtent } from './equal-aspect';
import { markerIndices, type PanelLayout } from './panel-layout';
import { markerPath, styleFor } from './series-style';
import { formatHz, formatSi } from './si-format';
import { polylinePath } from './svg-path';

export interface FrequencyMark {
  readonly x: number;
  readonly y: number;
  readonly label: string;
  /** Where the label goes, inside the plot and clear of the other marks' labels (absent for an unlabelled dot). */
  readonly box?: PlacedLabel;
}

export interface NyquistLayout extends PanelLayout {
  readonly width: number;
  readonly height: number;
  /** Data units per SVG unit on both axes (they are equal by construction). */
  readonly unitsPerPixel: number;
  /** Decade frequencies marked along the first series so the reader can place the arc in f. */
  readonly frequencyMarks: readonly FrequencyMark[];
}

const MARGIN = { left: 68, right: 16, top: 12, bottom: 40 };
/** SVG units between two labelled decade marks. */
const MIN_LABEL_GAP = 28;

/**
 * −Z″ against Z′ with equal axes. The reference band is the region swept by the library's
 * per-frequency boxes [Z′ low, Z′ high] × [−Z″ high, −Z″ low]: each pair of neighbouring boxes
 * is joined by its convex hull, so the band stays continuous between grid points.
 */
export function nyquistLayout(
  series: readonly SpectrumSeries[],
  band: ReferenceBand | null,
  width: number,
  height: number,
  unit = 'Ω',
): NyquistLayout {
  const area: PlotArea = {
    left: MARGIN.left,
    top: MARGIN.top,
    width: width - MARGIN.left - MARGIN.right,
    height: height - MARGIN.top - MARGIN.bottom,
  };
  const negIm = series.map((s) => Float64Array.from(s.im, (v) => -v));
  const bandNegImLow = band ? Float64Array.from(band.imHigh, (v) => -v) : new Float64Array();
  const bandNegImHigh = band ? Float64Array.from(band.imLow, (v) => -v) : new Float64Array();
  const xExtent = finiteExtent(...series.map((s) => s.re), ...(band ? [band.reLow, band.reHigh] : []));
  const yExtent = finiteExtent(...negIm, bandNegImLow, bandNegImHigh);
  const { x, y, unitsPerPixel } = equalAspectScales(xExtent, yExtent, area);

  const drawn = series.map((s, k) => {
    const xs = Array.from(s.re, (v) => x(v));
    const ys = Array.from(negIm[k], (v) => y(v));
    const style = styleFor(series, k);
    return {
      label: s.label,
      d: polylinePath(xs, ys),
      markers: markerIndices(xs.length, k).map((i) => markerPath(style.marker, xs[i], ys[i])).join(''),
      style,
      muted: !!s.muted,
    };
  });

  let bandD = '';
  if (band) {
    const boxes = Array.from(band.frequencyHz, (_, i) => [
      [x(band.reLow[i]), y(bandNegImLow[i])],
      [x(band.reHigh[i]), y(bandNegImLow[i])],
      [x(band.reHigh[i]), y(bandNegImHigh[i])],
      [x(band.reLow[i]), y(bandNegImHigh[i])],
    ] as [number, number][]);
    const hulls = boxes.length === 1 ? [convexHull(boxes[0])] : boxes.slice(1).map((b, i) => convexHull([...boxes[i], ...b]));
    bandD = hulls.map((h) => `M${h.map(([px, py]) => `${px.toFixed(2)},${py.toFixed(2)}`).join('L')}Z`).join('');
  }

  const first = series.find((s) => !s.muted) ?? series[0];
  return {
    width,
    height,
    area,
    unitsPerPixel,
    xTicks: linearTicks(x, 6, (v) => formatSi(v, unit)),
    yTicks: linearTicks(y, 5, (v) => formatSi(v, unit)),
    xLabel: `Z′ (${unit})`,
    yLabel: `−Z″ (${unit})`,
    series: drawn,
    band: bandD,
    frequencyMarks: placeMarkLabels(first ? decadeMarks(first, (v) => x(v), (v) => y(-v)) : [], area),
  };
}

/** The sample nearest each whole decade of frequency, when one lies within a tenth of a decade. */
export function decadeMarks(
  s: SpectrumSeries,
  toX: (re: number) => number,
  toY: (im: number) => number,
): FrequencyMark[] {
  const marks: FrequencyMark[] = [];
  const n = s.frequencyHz.length;
  if (n === 0) return marks;
  const lo = Math.ceil(Math.log10(s.frequencyHz[0]) - 0.1);
  const hi = Math.floor(Math.log10(s.frequencyHz[n - 1]) + 0.1);
  for (let k = lo; k <= hi; k++) {
    let best = -1;
    let bestGap = 0.1;
    for (let i = 0; i < n; i++) {
      const gap = Math.abs(Math.log10(s.frequencyHz[i]) - k);
      if (gap <= bestGap) {
        best = i;
        bestGap = gap;
      }
    }
    if (best >= 0) marks.push({ x: toX(s.re[best]), y: toY(s.im[best]), label: formatHz(10 ** k) });
  }
  // Where the arc bunches up (the low-frequency end), neighbouring labels would overprint: keep the dot, drop the word.
  let last: FrequencyMark | null = null;
  return marks.map((m) => {
    if (last && Math.hypot(m.x - last.x, m.y - last.y) < MIN_LABEL_GAP) return { ...m, label: '' };
    last = m;
    return m;
  });
}

/** Decade labels laid out inside the plot without overprinting each other or their dots. */
function placeMarkLabels(marks: readonly FrequencyMark[], area: PlotArea): FrequencyMark[] {
  const labelled = marks.filter((m) => m.label);
  const boxes = placeLabels(
    labelled.map((m, i) => ({ id: String(i), anchor: { x: m.x, y: m.y }, width: estimateTextWidth(m.label, 11), height: 14, offset: 4,
      sides: ['above-right', 'above-left', 'below-right', 'below-left', 'right', 'left'] as const })),
    { x: area.left, y: area.top, width: area.width, height: area.height },
    { gap: 2, obstacles: marks.map((m) => ({ x: m.x - 3, y: m.y - 3, width: 6, height: 6 })) },
  );
  let k = 0;
  return marks.map((m) => (m.label ? { ...m, box: boxes[k++] } : m));
}
