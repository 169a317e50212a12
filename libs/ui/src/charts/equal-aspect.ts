import { scaleLinear, type ScaleLinear } from 'd3-scale';
import type { PlotArea } from './chart-types';

export interface EqualAspectScales {
  readonly x: ScaleLinear<number, number>;
  /** Maps data up the page: larger values sit higher (smaller SVG y). */
  readonly y: ScaleLinear<number, number>;
  /** Data units per SVG unit, the same on both axes. */
  readonly unitsPerPixel: number;
}

/**
 * Scales with one data unit the same length on both axes, as a Nyquist plot and a distance map
 * need: unequal axes turn semicircles into ellipses and distort distances. The tighter axis is
 * widened about the data's centre; `padFraction` leaves room around the data.
 */
export function equalAspectScales(
  xExtent: readonly [number, number],
  yExtent: readonly [number, number],
  area: PlotArea,
  padFraction = 0.05,
): EqualAspectScales {
  let [x0, x1] = ordered(xExtent);
  let [y0, y1] = ordered(yExtent);
  // A single point (or a flat line) still needs a window around it.
  const span = Math.max(x1 - x0, y1 - y0) || Math.max(Math.abs(x0), Math.abs(y0), 1);
  if (x1 - x0 === 0) [x0, x1] = [x0 - span / 2, x1 + span / 2];
  if (y1 - y0 === 0) [y0, y1] = [y0 - span / 2, y1 + span / 2];
  const pad = padFraction * Math.max(x1 - x0, y1 - y0);
  x0 -= pad; x1 += pad; y0 -= pad; y1 += pad;
  const unitsPerPixel = Math.max((x1 - x0) / area.width, (y1 - y0) / area.height);
  const xMid = (x0 + x1) / 2;
  const yMid = (y0 + y1) / 2;
  const halfW = (unitsPerPixel * area.width) / 2;
  const halfH = (unitsPerPixel * area.height) / 2;
  return {
    x: scaleLinear().domain([xMid - halfW, xMid + halfW]).range([area.left, area.left + area.width]),
    y: scaleLinear().domain([yMid - halfH, yMid + halfH]).range([area.top + area.height, area.top]),
    unitsPerPixel,
  };
}

/** Smallest and largest finite value across arrays; [0, 1] when there is none. */
export function finiteExtent(...arrays: ArrayLike<number>[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (Number.isFinite(v)) {
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

function ordered([a, b]: readonly [number, number]): [number, number] {
  return a <= b ? [a, b] : [b, a];
}
