import type { ScaleLinear, ScaleLogarithmic } from 'd3-scale';
import type { AxisTick } from './chart-types';
import { formatNumber } from './si-format';

/**
 * Ticks for a base-10 log axis: every decade labelled, the 2…9 multiples as unlabelled minor
 * ticks while the axis spans few enough decades for them to stay readable.
 */
export function logTicks(
  scale: ScaleLogarithmic<number, number>,
  format: (value: number) => string,
  maxDecadesForMinor = 6,
): AxisTick[] {
  const [d0, d1] = scale.domain();
  const lo = Math.min(d0, d1);
  const hi = Math.max(d0, d1);
  const first = Math.floor(Math.log10(lo) + 1e-9);
  const last = Math.ceil(Math.log10(hi) - 1e-9);
  const decades = last - first;
  // Above ~8 decades every decade label would collide; label every other one.
  const labelEvery = decades > 8 ? 2 : 1;
  const ticks: AxisTick[] = [];
  for (let k = first; k <= last; k++) {
    const decade = 10 ** k;
    if (decade >= lo * (1 - 1e-9) && decade <= hi * (1 + 1e-9)) {
      ticks.push({ position: scale(decade), label: (k - first) % labelEvery === 0 ? format(decade) : '', major: true });
    }
    if (decades <= maxDecadesForMinor) {
      for (let m = 2; m <= 9; m++) {
        const v = m * decade;
        if (v > lo && v < hi) ticks.push({ position: scale(v), label: '', major: false });
      }
    }
  }
  return ticks.sort((a, b) => a.position - b.position);
}

/** Evenly spaced "nice" ticks of a linear axis, all labelled. */
export function linearTicks(
  scale: ScaleLinear<number, number>,
  count: number,
  format: (value: number) => string = formatNumber,
): AxisTick[] {
  return scale.ticks(count).map((v) => ({ position: scale(v), label: format(v), major: true }));
}
