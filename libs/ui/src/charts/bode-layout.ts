import { scaleLinear, scaleLog } from 'd3-scale';
import { linearTicks, logTicks } from './axis-ticks';
import type { PlotArea, ReferenceBand, SpectrumSeries } from './chart-types';
import { finiteExtent } from './equal-aspect';
import { markerIndices, type DrawnSeries, type PanelLayout } from './panel-layout';
import { markerPath, styleFor } from './series-style';
import { formatHz, formatNumber, formatSi } from './si-format';
import { modulus, phaseDeg } from './spectrum-polar';
import { bandPath, polylinePath } from './svg-path';

export interface BodeLayout {
  readonly width: number;
  readonly height: number;
  readonly magnitude: PanelLayout;
  readonly phase: PanelLayout;
}

const MARGIN = { left: 68, right: 16, top: 12, gap: 28, bottom: 40 };

/**
 * Two stacked panels over one shared log-frequency axis: |Z| on a log scale above, the phase in
 * degrees below, with the reference band (if any) shaded behind the series.
 */
export function bodeLayout(
  series: readonly SpectrumSeries[],
  band: ReferenceBand | null,
  width: number,
  height: number,
  unit = 'Ω',
): BodeLayout {
  const plotWidth = width - MARGIN.left - MARGIN.right;
  const panelHeight = (height - MARGIN.top - MARGIN.gap - MARGIN.bottom) / 2;
  const magArea: PlotArea = { left: MARGIN.left, top: MARGIN.top, width: plotWidth, height: panelHeight };
  const phaseArea: PlotArea = { left: MARGIN.left, top: MARGIN.top + panelHeight + MARGIN.gap, width: plotWidth, height: panelHeight };

  const polar = series.map((s) => {
    const mag = new Float64Array(s.re.length);
    const ph = new Float64Array(s.re.length);
    for (let i = 0; i < s.re.length; i++) {
      mag[i] = modulus(s.re[i], s.im[i]);
      ph[i] = phaseDeg(s.re[i], s.im[i]);
    }
    return { mag, ph };
  });

  const freqExtent = positiveExtent(...series.map((s) => s.frequencyHz), ...(band ? [band.frequencyHz] : []));
  const magExtent = positiveExtent(...polar.map((p) => p.mag), ...(band ? [band.modulusLow, band.modulusHigh] : []));
  const phaseExtent = finiteExtent(...polar.map((p) => p.ph), ...(band ? [band.phaseLowDeg, band.phaseHighDeg] : []));

  const x = scaleLog().domain(freqExtent).range([MARGIN.left, MARGIN.left + plotWidth]).nice();
  const yMag = scaleLog().domain(magExtent).range([magArea.top + magArea.height, magArea.top]).nice();
  const yPhase = scaleLinear()
    .domain(phaseExtent[0] === phaseExtent[1] ? [phaseExtent[0] - 5, phaseExtent[1] + 5] : phaseExtent)
    .range([phaseArea.top + phaseArea.height, phaseArea.top])
    .nice(5);

  const draw = (values: (i: number) => Float64Array, scaleY: (v: number) => number): DrawnSeries[] =>
    series.map((s, k) => {
      const xs = Array.from(s.frequencyHz, (f) => x(f));
      const ys = Array.from(values(k), (v) => scaleY(v));
      const style = styleFor(series, k);
      return {
        label: s.label,
        d: polylinePath(xs, ys),
        markers: markerIndices(xs.length, k)
          .filter((i) => Number.isFinite(ys[i]))
          .map((i) => markerPath(style.marker, xs[i], ys[i]))
          .join(''),
        style,
        muted: !!s.muted,
      };
    });

  const bandXs = band ? Array.from(band.frequencyHz, (f) => x(f)) : [];
  const frequencyTicks = logTicks(x, formatHz);
  return {
    width,
    height,
    magnitude: {
      area: magArea,
      xTicks: frequencyTicks.map((t) => ({ ...t, label: '' })),
      yTicks: logTicks(yMag, (v) => formatSi(v, unit)),
      xLabel: '',
      yLabel: `|Z| (${unit})`,
      series: draw((k) => polar[k].mag, (v) => (v > 0 ? yMag(v) : NaN)),
      band: band ? bandPath(bandXs, Array.from(band.modulusLow, (v) => yMag(v)), Array.from(band.modulusHigh, (v) => yMag(v))) : '',
    },
    phase: {
      area: phaseArea,
      xTicks: frequencyTicks,
      yTicks: linearTicks(yPhase, 5, (v) => `${formatNumber(v)}°`),
      xLabel: 'Frequency',
      yLabel: 'Phase (°)',
      series: draw((k) => polar[k].ph, yPhase),
      band: band ? bandPath(bandXs, Array.from(band.phaseLowDeg, (v) => yPhase(v)), Array.from(band.phaseHighDeg, (v) => yPhase(v))) : '',
    },
  };
}

/** Extent of the strictly positive finite values (a log axis cannot show the rest). */
export function positiveExtent(...arrays: ArrayLike<number>[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (Number.isFinite(v) && v > 0) {
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  }
  if (!(lo <= hi)) return [1, 10];
  return lo === hi ? [lo / 2, hi * 2] : [lo, hi];
}
