import { scaleLinear, scaleLog } from 'd3-scale';
import { linearTicks, logTicks } from './axis-ticks';
import type { PlotArea } from './chart-types';
import { markerIndices, type PanelLayout } from './panel-layout';
import { markerPath, seriesStyle } from './series-style';
import { formatHz, formatNumber } from './si-format';
import { polylinePath } from './svg-path';
import { positiveExtent } from './bode-layout';

/** Residuals of the linear Kramers–Kronig test of one spectrum, in % of |Z|. */
export interface KkResiduals {
  readonly frequencyHz: ArrayLike<number>;
  readonly rePercent: ArrayLike<number>;
  readonly imPercent: ArrayLike<number>;
  /** The method's pass limit, in %; drawn as ±limit lines. */
  readonly limitPercent: number;
}

export interface KkResidualLayout extends PanelLayout {
  readonly width: number;
  readonly height: number;
  readonly limitLines: { readonly upper: number; readonly lower: number };
  /** Points whose residual exceeds the limit, to ring them on the plot. */
  readonly outside: readonly { readonly x: number; readonly y: number }[];
}

const MARGIN = { left: 56, right: 16, top: 12, bottom: 40 };

/**
 * Residuals against log frequency with a symmetric y axis, wide enough for both the data and
 * the limit lines, so a pass and a fail look different at a glance.
 */
export function kkResidualLayout(r: KkResiduals, width: number, height: number): KkResidualLayout {
  const area: PlotArea = {
    left: MARGIN.left,
    top: MARGIN.top,
    width: width - MARGIN.left - MARGIN.right,
    height: height - MARGIN.top - MARGIN.bottom,
  };
  let worst = 0;
  for (const arr of [r.rePercent, r.imPercent]) {
    for (let i = 0; i < arr.length; i++) if (Number.isFinite(arr[i])) worst = Math.max(worst, Math.abs(arr[i]));
  }
  const reach = Math.max(worst * 1.1, r.limitPercent * 1.5, 0.1);
  const x = scaleLog().domain(positiveExtent(r.frequencyHz)).range([area.left, area.left + area.width]).nice();
  const y = scaleLinear().domain([-reach, reach]).range([area.top + area.height, area.top]).nice(6);
  const xs = Array.from(r.frequencyHz, (f) => x(f));
  const parts = [
    { label: 'Z′ residual', values: r.rePercent },
    { label: 'Z″ residual', values: r.imPercent },
  ];
  const outside: { x: number; y: number }[] = [];
  const series = parts.map((p, k) => {
    const ys = Array.from(p.values, (v) => y(v));
    const style = seriesStyle(k);
    for (let i = 0; i < p.values.length; i++) {
      if (Math.abs(p.values[i]) > r.limitPercent) outside.push({ x: xs[i], y: ys[i] });
    }
    return {
      label: p.label,
      d: polylinePath(xs, ys),
      markers: markerIndices(xs.length, k, xs.length).map((i) => markerPath(style.marker, xs[i], ys[i], 2.5)).join(''),
      style,
      muted: false,
    };
  });
  return {
    width,
    height,
    area,
    xTicks: logTicks(x, formatHz),
    yTicks: linearTicks(y, 6, (v) => `${formatNumber(v)} %`),
    xLabel: 'Frequency',
    yLabel: 'Residual (% of |Z|)',
    series,
    band: '',
    limitLines: { upper: y(r.limitPercent), lower: y(-r.limitPercent) },
    outside,
  };
}
