/**
 * Ohmprint's control chart for a cell constant: an individuals chart (common SPC practice).
 *
 * Baseline rule: the first `baselineSize` runs (default 10; rules apply once at least
 * `minimumBaseline`, default 5, exist) give the centre line (their mean) and σ (the mean moving
 * range ÷ 1.128, the usual estimate for individuals charts). Limits are centre ± 3σ.
 *
 * Ohmprint's run rules (common SPC practice):
 *  - `beyond-3-sigma`: one point outside centre ± 3σ;
 *  - `run-one-side`: `runLength` (default 8) points in a row on one side of the centre line;
 *  - `trend`: `trendLength` (default 6) points in a row each higher (or each lower) than the last.
 * After a point breaks a rule the run and trend counts start again from the next point, so one new
 * run inside the limits brings the cell back.
 */
export type ControlRule = 'beyond-3-sigma' | 'run-one-side' | 'trend';

export interface ControlChartOptions {
  readonly baselineSize?: number;
  readonly minimumBaseline?: number;
  readonly runLength?: number;
  readonly trendLength?: number;
}

export interface ControlSignal {
  readonly rule: ControlRule;
  readonly message: string;
}

export interface ControlPoint {
  readonly value: number;
  readonly inBaseline: boolean;
  readonly signals: readonly ControlSignal[];
}

export interface ControlChart {
  /** Null while the baseline has fewer than `minimumBaseline` runs. */
  readonly centre: number | null;
  readonly sigma: number | null;
  readonly upperLimit: number | null;
  readonly lowerLimit: number | null;
  readonly baselineCount: number;
  readonly points: readonly ControlPoint[];
  /** False when the newest point breaks a rule. */
  readonly inControl: boolean;
}

/** d₂ for moving ranges of two consecutive points (common SPC constant). */
const D2 = 1.128;

export function controlChart(values: readonly number[], options: ControlChartOptions = {}): ControlChart {
  const baselineSize = options.baselineSize ?? 10;
  const minimumBaseline = options.minimumBaseline ?? 5;
  const runLength = options.runLength ?? 8;
  const trendLength = options.trendLength ?? 6;
  for (const v of values) if (!Number.isFinite(v)) throw new RangeError(`control chart values must be finite, got ${v}`);
  const baseline = values.slice(0, baselineSize);
  if (baseline.length < minimumBaseline) {
    return { centre: null, sigma: null, upperLimit: null, lowerLimit: null, baselineCount: baseline.length, inControl: true, points: values.map((value) => ({ value, inBaseline: true, signals: [] })) };
  }
  const centre = baseline.reduce((s, v) => s + v, 0) / baseline.length;
  let mr = 0;
  for (let i = 1; i < baseline.length; i++) mr += Math.abs(baseline[i] - baseline[i - 1]);
  const sigma = mr / (baseline.length - 1) / D2;
  const upper = centre + 3 * sigma;
  const lower = centre - 3 * sigma;
  const fmt = (v: number) => v.toPrecision(5);

  const points: ControlPoint[] = [];
  let side = 0;
  let sideCount = 0;
  let direction = 0;
  let trendCount = 1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    const signals: ControlSignal[] = [];
    if (v > upper || v < lower) {
      signals.push({ rule: 'beyond-3-sigma', message: `${fmt(v)} is outside the 3σ limits ${fmt(lower)}–${fmt(upper)}` });
    }
    const s = Math.sign(v - centre);
    if (s !== 0 && s === side) sideCount++;
    else {
      side = s;
      sideCount = s === 0 ? 0 : 1;
    }
    if (sideCount >= runLength) signals.push({ rule: 'run-one-side', message: `${sideCount} runs in a row ${side > 0 ? 'above' : 'below'} the centre line ${fmt(centre)}` });
    const prev = i > 0 && points[i - 1].signals.length === 0 ? values[i - 1] : null;
    const d = prev === null ? 0 : Math.sign(v - prev);
    if (prev === null) trendCount = 1;
    else if (d !== 0 && d === direction) trendCount++;
    else {
      direction = d;
      trendCount = d === 0 ? 1 : 2;
    }
    if (trendCount >= trendLength) signals.push({ rule: 'trend', message: `${trendCount} runs in a row each ${direction > 0 ? 'higher' : 'lower'} than the last` });
    if (signals.length) {
      side = 0;
      sideCount = 0;
      direction = 0;
      trendCount = 1;
    }
    points.push({ value: v, inBaseline: i < baseline.length, signals });
  }
  const last = points[points.length - 1];
  return { centre, sigma, upperLimit: upper, lowerLimit: lower, baselineCount: baseline.length, points, inControl: !last || last.signals.length === 0 };
}
