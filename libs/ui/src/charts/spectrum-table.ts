import type { ChartTable, ReferenceBand, SpectrumSeries } from './chart-types';
import { positiveExtent } from './bode-layout';
import { finiteExtent } from './equal-aspect';
import { formatHz, formatNumber, formatSi } from './si-format';
import { modulus, phaseDeg } from './spectrum-polar';

/**
 * Table rows by frequency with Z′, Z″, |Z| and phase per series. Series on different grids get
 * blank cells where they have no point, never an interpolated figure.
 */
export function spectrumTable(series: readonly SpectrumSeries[], unit: string, caption: string): ChartTable {
  const frequencies = [...new Set(series.flatMap((s) => Array.from(s.frequencyHz)))].sort((a, b) => a - b);
  const lookups = series.map((s) => new Map(Array.from(s.frequencyHz, (f, i) => [f, i] as const)));
  const columns = ['Frequency', ...series.flatMap((s) => [`${s.label} Z′ (${unit})`, `Z″ (${unit})`, `|Z| (${unit})`, 'Phase (°)'])];
  const rows = frequencies.map((f) => [
    formatHz(f),
    ...series.flatMap((s, k) => {
      const i = lookups[k].get(f);
      if (i === undefined) return ['', '', '', ''];
      return [
        formatNumber(s.re[i]),
        formatNumber(s.im[i]),
        formatNumber(modulus(s.re[i], s.im[i])),
        formatNumber(phaseDeg(s.re[i], s.im[i]), 3),
      ];
    }),
  ]);
  return { caption, columns, rows };
}

/** A one-sentence description of what a spectrum chart shows, for its accessible name. */
export function spectrumSummary(kind: string, series: readonly SpectrumSeries[], band: ReferenceBand | null, unit: string): string {
  if (series.length === 0) return `${kind}: no spectra to show.`;
  const [f0, f1] = positiveExtent(...series.map((s) => s.frequencyHz));
  const mags = series.map((s) => Float64Array.from(s.re, (re, i) => modulus(re, s.im[i])));
  const phases = series.map((s) => Float64Array.from(s.re, (re, i) => phaseDeg(re, s.im[i])));
  const [m0, m1] = positiveExtent(...mags);
  const [p0, p1] = finiteExtent(...phases);
  const excluded = series.filter((s) => s.muted).length;
  const count = `${series.length} ${series.length === 1 ? 'spectrum' : 'spectra'}${excluded ? ` (${excluded} excluded)` : ''}`;
  return (
    `${kind} of ${count} from ${formatHz(f0)} to ${formatHz(f1)}; ` +
    `|Z| from ${formatSi(m0, unit)} to ${formatSi(m1, unit)}; phase from ${formatNumber(p0, 3)}° to ${formatNumber(p1, 3)}°` +
    (band ? `; shaded: ${band.label}.` : '.')
  );
}
