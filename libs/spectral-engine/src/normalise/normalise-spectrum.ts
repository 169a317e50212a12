import type { Spectrum } from '../spectrum';
import { compensationFactor } from './temperature-referral';

export interface NormalisationSettings {
  /** Cell constant K in cm⁻¹ (from a conductivity standard, see cellConstantFromStandard). */
  readonly cellConstantPerCm: number;
  /** Sample temperature during the sweep, °C. */
  readonly temperatureC: number;
  /** The method's reference temperature, °C. */
  readonly referenceTemperatureC: number;
  /** Linear temperature coefficient of conductivity as a fraction per °C (≈ 0.02 common practice; matrix-specific). */
  readonly coefficientPerC: number;
}

/**
 * Specific impedance referred to the reference temperature: Z·(1 + α(T − T_ref))/K in Ω·cm.
 * Dividing by K removes the cell's geometry (Z/K = 1/κ for a pure resistance); the factor is the
 * linear conductivity compensation applied to the whole complex spectrum, as is common practice.
 * @returns a new spectrum, same frequencies (Hz), impedance in Ω·cm
 */
export function normaliseSpectrum(s: Spectrum, settings: NormalisationSettings): Spectrum {
  const k = settings.cellConstantPerCm;
  if (!(k > 0) || !Number.isFinite(k)) throw new RangeError(`cellConstantPerCm must be a positive number, got ${k}`);
  const factor = compensationFactor(settings.temperatureC, settings.referenceTemperatureC, settings.coefficientPerC) / k;
  return {
    frequencyHz: Float64Array.from(s.frequencyHz),
    re: Float64Array.from(s.re, (v) => v * factor),
    im: Float64Array.from(s.im, (v) => v * factor),
  };
}
