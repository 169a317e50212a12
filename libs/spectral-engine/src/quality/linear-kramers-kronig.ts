import type { Spectrum } from '../spectrum';
import { householderLeastSquares } from './householder-least-squares';

export interface KramersKronigOptions {
  /** Largest |residual| (% of |Z|) that still passes; default 1 — a rule of thumb, so a method setting. */
  readonly limitPct?: number;
  /** μ threshold that ends the search for the number of elements; default 0.85 (Schönleber et al. 2014). */
  readonly muCriterion?: number;
  /** Use exactly this many RC elements instead of searching. */
  readonly elements?: number;
  /**
   * Upper end of the search; default half the number of frequencies (at least one element per
   * decade), well below the point count, where the elements would start fitting the noise.
   */
  readonly maxElements?: number;
  /** Include a series inductance (cable and instrument leads); default true. */
  readonly inductance?: boolean;
  /**
   * Include a series capacitance. Default: only when −Z″ is still rising at the lowest frequency
   * (a diffusion tail or blocking electrodes), which RC elements inside the band cannot follow.
   */
  readonly capacitance?: boolean;
}

export interface KramersKronigResult {
  /** Every residual within the limit. */
  readonly passed: boolean;
  readonly limitPct: number;
  /** Largest absolute residual of real or imaginary part, % of |Z|. */
  readonly maxAbsResidualPct: number;
  /** μ = 1 − Σ|R_k<0| / Σ|R_k≥0| at the chosen number of elements. */
  readonly mu: number;
  /** Number of RC elements used. */
  readonly elements: number;
  /** (Z′ − Ẑ′)/|Z| and (Z″ − Ẑ″)/|Z| in %, per frequency (ascending). */
  readonly residualsRePct: Float64Array;
  readonly residualsImPct: Float64Array;
  /** Σ of squared fractional residuals. */
  readonly pseudoChiSquare: number;
  /** Noise level the residuals suggest, √(5000·χ²/N) in %. */
  readonly noiseEstimatePct: number;
}

/** How many extra elements the search tries past its current choice before settling. */
const LOOK_AHEAD = 5;
/** Default ceiling on the element count, as a fraction of the number of frequencies. */
const MAX_ELEMENTS_PER_POINT = 1 / 2;

interface Trial {
  readonly elements: number;
  readonly mu: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
  readonly maxAbs: number;
  readonly chi2: number;
}

function fitWith(s: Spectrum, omega: Float64Array, modulus: Float64Array, m: number, options: Required<Pick<KramersKronigOptions, 'inductance' | 'capacitance'>>): Trial | null {
  const n = omega.length;
  const rows = 2 * n;
  const extra = 1 + (options.inductance ? 1 : 0) + (options.capacitance ? 1 : 0);
  const cols = m + extra;
  if (cols > rows) return null;
  const omegaMax = omega[n - 1];
  const omegaMin = omega[0];
  const tau = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const t = m === 1 ? 0.5 : k / (m - 1);
    tau[k] = Math.exp(Math.log(1 / omegaMax) + t * Math.log(omegaMax / omegaMin));
  }
  const a = new Float64Array(rows * cols);
  const b = new Float64Array(rows);
  for (let i = 0; i < n; i++) {
    const w = 1 / modulus[i];
    b[i] = s.re[i] * w;
    b[n + i] = s.im[i] * w;
    a[i] = w;
    for (let k = 0; k < m; k++) {
      const x = omega[i] * tau[k];
      const d = 1 + x * x;
      a[(1 + k) * rows + i] = w / d;
      a[(1 + k) * rows + n + i] = (-x / d) * w;
    }
    let c = 1 + m;
    if (options.inductance) a[c++ * rows + n + i] = omega[i] * w;
    if (options.capacitance) a[c * rows + n + i] = (-1 / omega[i]) * w;
  }
  const basis = Float64Array.from(a);
  const x = householderLeastSquares(a, rows, cols, Float64Array.from(b));
  if (!x) return null;
  let positive = 0;
  let negative = 0;
  for (let k = 1; k <= m; k++) {
    if (x[k] >= 0) positive += x[k];
    else negative -= x[k];
  }
  const mu = positive > 0 ? 1 - negative / positive : 0;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  let maxAbs = 0;
  let chi2 = 0;
  for (let i = 0; i < n; i++) {
    let fr = 0;
    let fi = 0;
    for (let c = 0; c < cols; c++) {
      fr += basis[c * rows + i] * x[c];
      fi += basis[c * rows + n + i] * x[c];
    }
    // Rows are already divided by |Z|, so the differences are fractions of |Z|.
    const dr = b[i] - fr;
    const di = b[n + i] - fi;
    re[i] = 100 * dr;
    im[i] = 100 * di;
    chi2 += dr * dr + di * di;
    maxAbs = Math.max(maxAbs, Math.abs(re[i]), Math.abs(im[i]));
  }
  return { elements: m, mu, re, im, maxAbs, chi2 };
}

/**
 * Linear Kramers–Kronig test (Boukamp 1995; Schönleber, Klotz & Ivers-Tiffée 2014): fits
 * R0 + Σ R_k/(1 + jωτ_k) (+ jωL) with time constants log-spaced from 1/ω_max to 1/ω_min, rows
 * weighted by 1/|Z|, and raises the number of elements until μ ≤ the criterion (or until the
 * residuals are within a twentieth of the limit, when the verdict can no longer change).
 *
 * On clean data μ can fall below the criterion early while the fit is still poor (one ideal RC
 * element is the known case); the search therefore looks up to five elements further and moves on
 * whenever one at least halves the largest residual, and starts from one element per decade, so
 * valid data is not failed by stopping too soon. The count never passes `maxElements` (default
 * half the points): on noisy data the residual stops halving near where μ stopped the search.
 * @param s spectrum, Hz and Ω, at least 3 frequencies
 * @returns residuals in % of |Z| and whether all are within `limitPct`
 */
export function linearKramersKronig(s: Spectrum, options: KramersKronigOptions = {}): KramersKronigResult {
  const n = s.frequencyHz.length;
  if (n < 3) throw new RangeError(`the Kramers–Kronig test needs at least 3 frequencies; the spectrum has ${n}`);
  const limitPct = options.limitPct ?? 1;
  const c = options.muCriterion ?? 0.85;
  const risingTail = n >= 2 && -s.im[0] > -s.im[1] && -s.im[1] > 0;
  const shape = { inductance: options.inductance ?? true, capacitance: options.capacitance ?? risingTail };
  const omega = Float64Array.from(s.frequencyHz, (f) => 2 * Math.PI * f);
  const modulus = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    modulus[i] = Math.hypot(s.re[i], s.im[i]);
    if (!(modulus[i] > 0) || !Number.isFinite(modulus[i])) throw new RangeError(`|Z| at ${s.frequencyHz[i]} Hz is zero or not finite`);
  }
  const extra = 1 + (shape.inductance ? 1 : 0) + (shape.capacitance ? 1 : 0);
  // At least one time constant per decade of the band, a floor against stopping on a lucky μ.
  const decades = Math.log10(s.frequencyHz[n - 1] / s.frequencyHz[0]);
  const perDecade = Math.max(1, Math.ceil(decades));
  const ceiling = options.maxElements ?? Math.max(perDecade, Math.floor(n * MAX_ELEMENTS_PER_POINT));
  const maxElements = Math.max(1, Math.min(ceiling, 2 * n - extra));

  let chosen: Trial | null = null;
  if (options.elements !== undefined) {
    // A count the caller chooses may go past the search's default ceiling, up to what the rows allow.
    const allowed = Math.min(options.maxElements ?? 2 * n - extra, 2 * n - extra);
    if (!Number.isInteger(options.elements) || options.elements < 1 || options.elements > allowed) {
      throw new RangeError(`elements must be an integer from 1 to ${allowed}`);
    }
    chosen = fitWith(s, omega, modulus, options.elements, shape);
  } else {
    let m = Math.min(maxElements, perDecade);
    let settled = false;
    for (; m <= maxElements; m++) {
      const trial = fitWith(s, omega, modulus, m, shape);
      if (!trial) break;
      chosen = trial;
      if (trial.mu <= c) break;
      // Residuals a twentieth of the limit cannot turn into a failure with more elements (each
      // extra element only lowers them), so clean spectra need not be searched to μ ≤ c.
      if (trial.maxAbs <= limitPct / 20) {
        settled = true;
        break;
      }
    }
    // Look ahead: on clean data the residual swings with the element count but keeps falling. A
    // count up to LOOK_AHEAD past the current choice replaces it when it at least halves the largest
    // residual; the search ends at residuals within a twentieth of the limit and never passes
    // maxElements (half the points by default), so it cannot climb towards the point count.
    let best = chosen;
    for (let ahead = (chosen?.elements ?? maxElements) + 1; best && !settled && ahead <= Math.min(maxElements, best.elements + LOOK_AHEAD); ahead++) {
      const trial = fitWith(s, omega, modulus, ahead, shape);
      if (!trial) break;
      if (trial.maxAbs < 0.5 * best.maxAbs) best = trial;
      if (best.maxAbs <= limitPct / 20) break;
    }
    chosen = best;
  }
  if (!chosen) throw new RangeError('the Kramers–Kronig fit is singular for this spectrum');
  return {
    passed: chosen.maxAbs <= limitPct,
    limitPct,
    maxAbsResidualPct: chosen.maxAbs,
    mu: chosen.mu,
    elements: chosen.elements,
    residualsRePct: chosen.re,
    residualsImPct: chosen.im,
    pseudoChiSquare: chosen.chi2,
    noiseEstimatePct: Math.sqrt((5000 * chosen.chi2) / n),
  };
}
