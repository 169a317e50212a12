import type { Spectrum } from '../spectrum';

export interface CellConstantOptions {
  /** Conductivity of the standard at the measurement temperature, µS/cm, from its certificate. */
  readonly standardConductivityUSPerCm: number;
  /** Points whose |phase| is at most this many degrees form the resistive plateau; default 1°. */
  readonly maxPhaseDeg?: number;
}

export interface CellConstant {
  /** K = κ_std·R, cm⁻¹. */
  readonly cellConstantPerCm: number;
  /** Median real impedance over the plateau, Ω. */
  readonly plateauResistanceOhm: number;
  /** Frequencies used, Hz. */
  readonly plateauFrequenciesHz: Float64Array;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

/**
 * Cell constant from a spectrum of a conductivity standard (e.g. KCl): K = κ_std·R with R the
 * real impedance on the plateau where the phase is ≈ 0° (median over those points).
 * @throws RangeError when no point is within `maxPhaseDeg` of 0°
 */
export function cellConstantFromStandard(s: Spectrum, options: CellConstantOptions): CellConstant {
  const kappa = options.standardConductivityUSPerCm;
  if (!(kappa > 0) || !Number.isFinite(kappa)) throw new RangeError(`standardConductivityUSPerCm must be positive, got ${kappa}`);
  const limit = options.maxPhaseDeg ?? 1;
  const resistances: number[] = [];
  const frequencies: number[] = [];
  for (let i = 0; i < s.frequencyHz.length; i++) {
    const phaseDeg = (Math.atan2(s.im[i], s.re[i]) * 180) / Math.PI;
    if (Math.abs(phaseDeg) <= limit && s.re[i] > 0) {
      resistances.push(s.re[i]);
      frequencies.push(s.frequencyHz[i]);
    }
  }
  if (resistances.length === 0) {
    throw new RangeError(`no resistive plateau: no frequency has a phase within ${limit}° of 0°, so the cell constant cannot be read`);
  }
  const r = median(resistances);
  return { cellConstantPerCm: kappa * 1e-6 * r, plateauResistanceOhm: r, plateauFrequenciesHz: Float64Array.from(frequencies) };
}

/** κ = K/R in µS/cm, for a resistance R in Ω and a cell constant K in cm⁻¹. */
export function conductivityFromResistance(resistanceOhm: number, cellConstantPerCm: number): number {
  return (cellConstantPerCm / resistanceOhm) * 1e6;
}
