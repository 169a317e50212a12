import type { Spectrum } from '../spectrum';
import { forEachArcPoint, putExponentTerm } from './arc-terms';
import type { Complex } from './complex';
import {
  cpe,
  havriliakNegami,
  randlesCpe,
  warburg,
  warburgFiniteLength,
  warburgFiniteSpace,
  zarc,
} from './closed-forms';
import type { ImpedanceModel, ModelParameter } from './model-types';
import { clamp, exponentFromArc, shapeFeatures, slope } from './shape-features';

const positive = (name: string, unit: string, description: string): ModelParameter => ({
  name,
  unit,
  description,
  lower: 0,
  upper: null,
});
const exponent = (name: string, description: string): ModelParameter => ({
  name,
  unit: '1',
  description,
  lower: 0,
  upper: 1,
});

const Q_UNIT = 'S·sⁿ';

type PointFormula = (p: Float64Array, omega: number) => Complex;

function pointwise(formula: PointFormula): ImpedanceModel['evaluate'] {
  return (p, omega, re, im) => {
    for (let i = 0; i < omega.length; i++) {
      const z = formula(p, omega[i]);
      re[i] = z.re;
      im[i] = z.im;
    }
  };
}

/** CPE parameters from the slope of log(−Z″) against log ω, which is −n for any R + CPE. */
function cpeFromImaginary(s: Spectrum, omega: Float64Array): { q: number; n: number } {
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < omega.length; i++) {
    if (s.im[i] < 0) {
      x.push(Math.log(omega[i]));
      y.push(Math.log(-s.im[i]));
    }
  }
  const n = x.length >= 2 ? clamp(-slope(x, y), 0.1, 1) : 0.8;
  let logQ = 0;
  for (let i = 0; i < x.length; i++) logQ += Math.log(Math.sin((n * Math.PI) / 2)) - y[i] - n * x[i];
  return { q: x.length ? Math.exp(logQ / x.length) : 1e-6, n };
}

function arcGuess(s: Spectrum): { high: number; low: number; tau: number; alpha: number } {
  const f = shapeFeatures(s);
  const low = Math.max(f.reLow, f.reHigh);
  const high = Math.max(Math.min(f.reHigh, f.reLow), 0);
  return {
    high,
    low,
    tau: 1 / f.peakOmega,
    alpha: exponentFromArc(f.peakNegIm, low - high),
  };
}

/**
 * CPE value and derivatives into columns from `offset`: Z = ω⁻ⁿe^{−jnπ/2}/Q,
 * ∂Z/∂Q = −Z/Q, ∂Z/∂n = −Z·(ln ω + jπ/2).
 */
function cpeDerivatives(
  q: number,
  n: number,
  omega: Float64Array,
  re: Float64Array,
  im: Float64Array,
  dRe: Float64Array,
  dIm: Float64Array,
  offset: number,
): void {
  const count = omega.length;
  const c = Math.cos((n * Math.PI) / 2);
  const sn = Math.sin((n * Math.PI) / 2);
  for (let i = 0; i < count; i++) {
    const logW = Math.log(omega[i]);
    const m = Math.exp(-n * logW) / q;
    const zr = m * c;
    const zi = -m * sn;
    re[i] = zr;
    im[i] = zi;
    dRe[offset + i] = -zr / q;
    dIm[offset + i] = -zi / q;
    putExponentTerm(dRe, dIm, offset + count + i, -1, zr, zi, logW);
  }
}

const cpeModel: ImpedanceModel = {
  name: 'cpe',
  label: 'Constant phase element',
  formula: 'Z = 1 / (Q·(jω)ⁿ)',
  parameters: [positive('q', Q_UNIT, 'CPE magnitude Q'), exponent('n', 'CPE exponent n (1 = ideal capacitor)')],
  evaluate: pointwise((p, w) => cpe(p[0], p[1], w)),
  derivatives(p, omega, re, im, dRe, dIm) {
    cpeDerivatives(p[0], p[1], omega, re, im, dRe, dIm, 0);
  },
  initialGuess(s) {
    const { q, n } = cpeFromImaginary(s, shapeFeatures(s).omega);
    return Float64Array.of(q, n);
  },
};

const rCpeModel: ImpedanceModel = {
  name: 'r-cpe',
  label: 'Resistance in series with a CPE',
  formula: 'Z = R + 1 / (Q·(jω)ⁿ)',
  parameters: [
    positive('r', 'Ω', 'Series resistance R'),
    positive('q', Q_UNIT, 'CPE magnitude Q'),
    exponent('n', 'CPE exponent n'),
  ],
  evaluate: pointwise((p, w) => {
    const z = cpe(p[1], p[2], w);
    return { re: p[0] + z.re, im: z.im };
  }),
  derivatives(p, omega, re, im, dRe, dIm) {
    const n = omega.length;
    cpeDerivatives(p[1], p[2], omega, re, im, dRe, dIm, n);
    for (let i = 0; i < n; i++) {
      re[i] += p[0];
      dRe[i] = 1;
      dIm[i] = 0;
    }
  },
  initialGuess(s) {
    const omega = shapeFeatures(s).omega;
    const { q, n } = cpeFromImaginary(s, omega);
    let r = 0;
    for (let i = 0; i < omega.length; i++) r += s.re[i] - Math.cos((n * Math.PI) / 2) / (q * omega[i] ** n);
    return Float64Array.of(Math.max(r / omega.length, 1e-3 * Math.abs(s.re[s.re.length - 1])), q, n);
  },
};

const rZarcModel: ImpedanceModel = {
  name: 'r-zarc',
  label: 'Series resistance and a ZARC (R ∥ CPE)',
  formula: 'Z = Rs + R / (1 + R·Q·(jω)ⁿ)',
  parameters: [
    positive('rs', 'Ω', 'Series resistance Rs'),
    positive('r', 'Ω', 'Parallel resistance R'),
    positive('q', Q_UNIT, 'CPE magnitude Q'),
    exponent('n', 'CPE exponent n'),
  ],
  evaluate: pointwise((p, w) => {
    const z = zarc(p[1], p[2], p[3], w);
    return { re: p[0] + z.re, im: z.im };
  }),
  derivatives(p, omega, re, im, dRe, dIm) {
    // With E = (jω)ⁿ and D = 1 + RQE: ∂Z/∂R = 1/D², ∂Z/∂Q = −R²E/D², ∂Z/∂n = −R(D − 1)(ln ω + jπ/2)/D².
    const count = omega.length;
    const [rs, r, q, n] = [p[0], p[1], p[2], p[3]];
    forEachArcPoint(omega, 1, r * q, n, (i, t) => {
      re[i] = rs + r * t.invRe;
      im[i] = r * t.invIm;
      dRe[i] = 1;
      dIm[i] = 0;
      dRe[count + i] = t.inv2Re;
      dIm[count + i] = t.inv2Im;
      dRe[2 * count + i] = -r * r * (t.unitRe * t.inv2Re - t.unitIm * t.inv2Im);
      dIm[2 * count + i] = -r * r * (t.unitRe * t.inv2Im + t.unitIm * t.inv2Re);
      putExponentTerm(dRe, dIm, 3 * count + i, -r, t.riseRe, t.riseIm, t.logX);
    });
  },
  initialGuess(s) {
    const g = arcGuess(s);
    const r = Math.max(g.low - g.high, 1e-9);
    // At the arc's apex RQωⁿ = 1, so Q = τⁿ/R.
    return Float64Array.of(g.high, r, Math.pow(g.tau, g.alpha) / r, g.alpha);
  },
};

/** Cole–Cole is evaluated in scalar form: it is the model the fitting benchmark exercises. */
const coleColeModel: ImpedanceModel = {
  name: 'cole-cole',
  label: 'Cole–Cole relaxation',
  formula: 'Z = R∞ + (R0 − R∞) / (1 + (jωτ)^α)',
  parameters: [
    positive('rInf', 'Ω', 'High-frequency resistance R∞'),
    positive('r0', 'Ω', 'Low-frequency resistance R0'),
    positive('tau', 's', 'Relaxation time τ'),
    exponent('alpha', 'Dispersion exponent α (1 = single relaxation)'),
  ],
  evaluate(p, omega, re, im) {
    const rInf = p[0];
    const delta = p[1] - p[0];
    const tau = p[2];
    const alpha = p[3];
    const c = Math.cos((alpha * Math.PI) / 2);
    const sn = Math.sin((alpha * Math.PI) / 2);
    for (let i = 0; i < omega.length; i++) {
      const m = Math.pow(omega[i] * tau, alpha);
      const dr = 1 + m * c;
      const di = m * sn;
      const k = delta / (dr * dr + di * di);
      re[i] = rInf + k * dr;
      im[i] = -k * di;
    }
  },
  derivatives(p, omega, re, im, dRe, dIm) {
    // With D = 1 + (jωτ)^α: ∂Z/∂R∞ = 1 − 1/D, ∂Z/∂R0 = 1/D, ∂Z/∂τ = −Δ(α/τ)(D − 1)/D²,
    // ∂Z/∂α = −Δ(D − 1)(ln ωτ + jπ/2)/D².
    const n = omega.length;
    const rInf = p[0];
    const delta = p[1] - p[0];
    const tau = p[2];
    const alpha = p[3];
    forEachArcPoint(omega, tau, 1, alpha, (i, t) => {
      re[i] = rInf + delta * t.invRe;
      im[i] = delta * t.invIm;
      dRe[i] = 1 - t.invRe;
      dIm[i] = -t.invIm;
      dRe[n + i] = t.invRe;
      dIm[n + i] = t.invIm;
      const k = -delta * (alpha / tau);
      dRe[2 * n + i] = k * t.riseRe;
      dIm[2 * n + i] = k * t.riseIm;
      putExponentTerm(dRe, dIm, 3 * n + i, -delta, t.riseRe, t.riseIm, t.logX);
    });
  },
  initialGuess(s) {
    const g = arcGuess(s);
    return Float64Array.of(g.high, g.low, g.tau, g.alpha);
  },
};

const havriliakNegamiModel: ImpedanceModel = {
  name: 'havriliak-negami',
  label: 'Havriliak–Negami relaxation',
  formula: 'Z = R∞ + (R0 − R∞) / (1 + (jωτ)^α)^β',
  parameters: [
    positive('rInf', 'Ω', 'High-frequency resistance R∞'),
    positive('r0', 'Ω', 'Low-frequency resistance R0'),
    positive('tau', 's', 'Relaxation time τ'),
    exponent('alpha', 'Width exponent α'),
    exponent('beta', 'Asymmetry exponent β (1 = Cole–Cole)'),
  ],
  evaluate: pointwise((p, w) => havriliakNegami(p[0], p[1], p[2], p[3], p[4], w)),
  initialGuess(s) {
    const g = arcGuess(s);
    return Float64Array.of(g.high, g.low, g.tau, g.alpha, 0.9);
  },
};

const warburgModel: ImpedanceModel = {
  name: 'warburg',
  label: 'Semi-infinite Warburg diffusion',
  formula: 'Z = σ·(1 − j) / √ω',
  parameters: [positive('sigma', 'Ω·s^-½', 'Warburg coefficient σ')],
  evaluate: pointwise((p, w) => warburg(p[0], w)),
  initialGuess(s) {
    const omega = shapeFeatures(s).omega;
    let logSigma = 0;
    for (let i = 0; i < omega.length; i++) {
      logSigma += Math.log(Math.max(Math.hypot(s.re[i], s.im[i]), 1e-300) * Math.sqrt(omega[i] / 2));
    }
    return Float64Array.of(Math.exp(logSigma / omega.length));
  },
};

const warburgFiniteLengthModel: ImpedanceModel = {
  name: 'warburg-finite-length',
  label: 'Finite-length Warburg (transmissive boundary)',
  formula: 'Z = Z0·tanh√(jωτ) / √(jωτ)',
  parameters: [positive('z0', 'Ω', 'Diffusion resistance Z0'), positive('tau', 's', 'Diffusion time τ')],
  evaluate: pointwise((p, w) => warburgFiniteLength(p[0], p[1], w)),
  initialGuess(s) {
    const f = shapeFeatures(s);
    // The −Z″ maximum of the transmissive element lies near ωτ ≈ 2.5.
    return Float64Array.of(Math.max(f.reLow, 1e-9), 2.5 / f.peakOmega);
  },
};

const warburgFiniteSpaceModel: ImpedanceModel = {
  name: 'warburg-finite-space',
  label: 'Finite-space Warburg (reflective boundary)',
  formula: 'Z = Z0·coth√(jωτ) / √(jωτ)',
  parameters: [positive('z0', 'Ω', 'Diffusion resistance Z0'), positive('tau', 's', 'Diffusion time τ')],
  evaluate: pointwise((p, w) => warburgFiniteSpace(p[0], p[1], w)),
  initialGuess(s) {
    const f = shapeFeatures(s);
    // At low frequency Z → Z0/3 + Z0/(jωτ).
    const z0 = Math.max(3 * f.reLow, 1e-9);
    return Float64Array.of(z0, z0 / Math.max(-s.im[0] * f.omega[0], 1e-300));
  },
};

const randlesCpeModel: ImpedanceModel = {
  name: 'randles-cpe',
  label: 'Randles cell with a CPE double layer',
  formula: 'Z = Rs + 1 / (Q·(jω)ⁿ + 1 / (Rct + σ·(1 − j)/√ω))',
  parameters: [
    positive('rs', 'Ω', 'Solution resistance Rs'),
    positive('rct', 'Ω', 'Charge-transfer resistance Rct'),
    positive('q', Q_UNIT, 'Double-layer CPE magnitude Q'),
    exponent('n', 'Double-layer CPE exponent n'),
    positive('sigma', 'Ω·s^-½', 'Warburg coefficient σ'),
  ],
  evaluate: pointwise((p, w) => randlesCpe(p[0], p[1], p[2], p[3], p[4], w)),
  initialGuess(s) {
    const f = shapeFeatures(s);
    const rs = Math.max(f.reHigh, 0);
    // When the diffusion tail rises above the arc, the largest −Z″ is at the lowest frequency: the
    // arc's apex is then the largest −Z″ above the lowest point between tail and arc.
    let peakIndex = f.peakIndex;
    if (peakIndex === 0 && s.im.length > 3) {
      let low = 1;
      for (let i = 2; i < s.im.length - 1; i++) if (-s.im[i] < -s.im[low]) low = i;
      peakIndex = low + 1;
      for (let i = low + 1; i < s.im.length; i++) if (-s.im[i] > -s.im[peakIndex]) peakIndex = i;
    }
    // The charge-transfer arc ends where −Z″ turns up again towards the diffusion tail.
    let valley = -1;
    for (let i = peakIndex - 1; i > 0; i--) {
      if (-s.im[i] <= -s.im[i - 1] && -s.im[i] <= -s.im[i + 1]) {
        valley = i;
        break;
      }
    }
    const rct = Math.max(valley > 0 ? s.re[valley] - rs : (f.reLow - rs) / 2, 1e-9);
    const n = exponentFromArc(-s.im[peakIndex], rct);
    const sigma = Math.max(-s.im[0] * Math.sqrt(f.omega[0]), 1e-9);
    return Float64Array.of(rs, rct, Math.pow(1 / f.omega[peakIndex], n) / rct, n, sigma);
  },
};

/** Every built-in model, by name. */
export const BUILTIN_MODELS: ReadonlyMap<string, ImpedanceModel> = new Map(
  [
    cpeModel,
    rCpeModel,
    rZarcModel,
    coleColeModel,
    havriliakNegamiModel,
    warburgModel,
    warburgFiniteLengthModel,
    warburgFiniteSpaceModel,
    randlesCpeModel,
  ].map((m) => [m.name, m]),
);

export type ModelName =
  | 'cpe'
  | 'r-cpe'
  | 'r-zarc'
  | 'cole-cole'
  | 'havriliak-negami'
  | 'warburg'
  | 'warburg-finite-length'
  | 'warburg-finite-space'
  | 'randles-cpe';
