/**
 * Invented demo spectra (labelled demo wherever they show): authentic lots for each demo product
 * and suspect samples (authentic-like, watered, blended), generated from fractional-order models
 * with invented lot-to-lot variation and measurement noise. Nothing here is measured data.
 */
import { impedance, logGrid, type Spectrum } from '@ohmprint/spectral-engine';
import { demoRandom, seedFrom, type DemoRandom } from './lab-demo-random';

export type DemoModel = 'cole-cole' | 'havriliak-negami';

/** Specific impedance of a product at the method's reference temperature, Ω·cm and s (invented). */
export interface DemoProfile {
  key: string;
  model: DemoModel;
  params: Record<string, number>;
}

export const DEMO_PROFILES: Record<string, DemoProfile> = {
  'ridgeline-red': { key: 'ridgeline-red', model: 'cole-cole', params: { rInf: 330, r0: 470, tau: 6.0e-6, alpha: 0.82 } },
  'hollin-white': { key: 'hollin-white', model: 'cole-cole', params: { rInf: 410, r0: 560, tau: 7.5e-6, alpha: 0.86 } },
  'whole-milk': {
    key: 'whole-milk',
    model: 'havriliak-negami',
    params: { rInf: 160, r0: 215, tau: 3.2e-6, alpha: 0.78, beta: 0.85 },
  },
  'skimmed-milk': {
    key: 'skimmed-milk',
    model: 'havriliak-negami',
    params: { rInf: 150, r0: 195, tau: 2.6e-6, alpha: 0.8, beta: 0.9 },
  },
  'cloudy-apple': { key: 'cloudy-apple', model: 'cole-cole', params: { rInf: 380, r0: 520, tau: 9.0e-6, alpha: 0.8 } },
};

/** Invented lot-to-lot spread: relative for resistances and τ, absolute for the exponents. */
const LOT_SPREAD = { resistance: 0.012, tau: 0.02, exponent: 0.006 };
/** Invented noise of one sweep, relative to each component. */
const SWEEP_NOISE = 0.0015;

function varied(profile: DemoProfile, rng: DemoRandom): Record<string, number> {
  const p = { ...profile.params };
  const common = rng.normal(0, LOT_SPREAD.resistance);
  p.rInf *= Math.exp(common + rng.normal(0, LOT_SPREAD.resistance / 3));
  p.r0 *= Math.exp(common + rng.normal(0, LOT_SPREAD.resistance / 3));
  p.tau *= Math.exp(rng.normal(0, LOT_SPREAD.tau));
  p.alpha = Math.min(1, p.alpha + rng.normal(0, LOT_SPREAD.exponent));
  if (p.beta !== undefined) p.beta = Math.min(1, p.beta + rng.normal(0, LOT_SPREAD.exponent));
  return p;
}

function noisy(s: Spectrum, rng: DemoRandom, relative: number): Spectrum {
  return {
    frequencyHz: s.frequencyHz,
    re: s.re.map((v) => v * (1 + rng.normal(0, relative))),
    im: s.im.map((v) => v * (1 + rng.normal(0, relative))),
  };
}

export interface DemoLot {
  lotCode: string;
  producedOn: string;
  /** Normalised (Ω·cm at the reference temperature) on the method grid. */
  spectrum: Spectrum;
}

/** `count` authentic lots of a product on `grid`, as averaged, normalised replicates would give. */
export function demoLots(profile: DemoProfile, grid: Float64Array, count: number, seedLabel = profile.key): DemoLot[] {
  const rng = demoRandom(seedFrom(`lots:${seedLabel}`));
  const lots: DemoLot[] = [];
  for (let i = 0; i < count; i++) {
    const s = impedance(profile.model, varied(profile, rng), grid);
    const day = 1 + ((i * 11) % 28);
    const month = 1 + (i % 12);
    lots.push({
      lotCode: `${profile.key.slice(0, 3).toUpperCase()}-L${String(i + 1).padStart(4, '0')}`,
      producedOn: `2025-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`,
      spectrum: noisy(s, rng, SWEEP_NOISE / Math.sqrt(3)),
    });
  }
  return lots;
}

/** What was done to a suspect sample (invented scenarios for the demo). */
export type Adulteration =
  | { kind: 'none' }
  | { kind: 'watered'; waterFraction: number }
  | { kind: 'blended'; with: DemoProfile; fraction: number };

/**
 * Parameters of a suspect sample. Adding water lowers conductivity about in proportion, so the
 * resistances and the relaxation time grow by 1/(1 − x); a blend mixes the parameters in log space.
 */
export function suspectParameters(profile: DemoProfile, adulteration: Adulteration, rng: DemoRandom): Record<string, number> {
  const p = varied(profile, rng);
  if (adulteration.kind === 'watered') {
    const k = 1 / (1 - adulteration.waterFraction);
    p.rInf *= k;
    p.r0 *= k;
    p.tau *= k;
  } else if (adulteration.kind === 'blended') {
    const other = adulteration.with.params;
    const f = adulteration.fraction;
    for (const name of Object.keys(p)) {
      const o = other[name];
      if (o === undefined) continue;
      p[name] = name === 'alpha' || name === 'beta' ? (1 - f) * p[name] + f * o : Math.exp((1 - f) * Math.log(p[name]) + f * Math.log(o));
    }
  }
  return p;
}

/** Conditions of a sweep on the bench. */
export interface SweepConditions {
  cellConstantPerCm: number;
  temperatureC: number;
  referenceTemperatureC: number;
  coefficientPerC: number;
}

/** The instrument's own sweep: 10 points per decade from 10 Hz to 1 MHz. */
export const SWEEP_HZ = logGrid(10, 1e6, 51);

/**
 * Replicate sweeps as the instrument would report them, in ohms: specific impedance times the
 * cell constant, and lower when warmer than the reference (linear compensation reversed).
 */
export function demoSweeps(params: Record<string, number>, model: DemoModel, conditions: SweepConditions, replicates: number, rng: DemoRandom): Spectrum[] {
  const factor = conditions.cellConstantPerCm / (1 + conditions.coefficientPerC * (conditions.temperatureC - conditions.referenceTemperatureC));
  const base = impedance(model, params, SWEEP_HZ);
  const scaled: Spectrum = { frequencyHz: base.frequencyHz, re: base.re.map((v) => v * factor), im: base.im.map((v) => v * factor) };
  return Array.from({ length: replicates }, () => noisy(scaled, rng, SWEEP_NOISE));
}

export { demoRandom, seedFrom };
