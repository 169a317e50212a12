import type { AxisTick, PlotArea } from './chart-types';
import type { SeriesStyle } from './series-style';

/** One drawn series inside a panel, ready for the template. */
export interface DrawnSeries {
  readonly label: string;
  readonly d: string;
  readonly markers: string;
  readonly style: SeriesStyle;
  readonly muted: boolean;
}

/** Everything a template needs to draw one set of axes with its data. */
export interface PanelLayout {
  readonly area: PlotArea;
  readonly xTicks: readonly AxisTick[];
  readonly yTicks: readonly AxisTick[];
  readonly xLabel: string;
  readonly yLabel: string;
  readonly series: readonly DrawnSeries[];
  /** Shaded reference band as one path, or empty when there is none. */
  readonly band: string;
}

/** Every `step`-th point, shifted per series so markers of overlapping replicates interleave. */
export function markerIndices(length: number, seriesIndex: number, perSeries = 10): number[] {
  if (length === 0) return [];
  const step = Math.max(1, Math.floor(length / perSeries));
  const offset = Math.floor((seriesIndex * step) / 4) % step;
  const out: number[] = [];
  for (let i = offset; i < length; i += step) out.push(i);
  return out;
}
