import { GridCoverageError, logGrid, normaliseSpectrum, resample, type Spectrum } from '@ohmprint/spectral-engine';
import type { MethodSettings } from '@ohmprint/contracts';
import type { Replicate } from './replicate.entity';

export interface PreparedReplicate {
  id: string;
  replicateNumber: number;
  /** Specific impedance (Ω·cm) at the reference temperature, on the method grid; null when the sweep misses part of the band. */
  spectrum: Spectrum | null;
  coverageProblem: string | null;
}

/** The method's grid, Hz ascending: over its sub-band when it names one, else over the band. */
export function methodGrid(method: MethodSettings): Float64Array {
  return logGrid(method.subBandMinHz ?? method.bandMinHz, method.subBandMaxHz ?? method.bandMaxHz, method.gridPoints);
}

export function measuredSpectrum(r: Pick<Replicate, 'frequencyHz' | 're' | 'im'>): Spectrum {
  return { frequencyHz: Float64Array.from(r.frequencyHz), re: Float64Array.from(r.re), im: Float64Array.from(r.im) };
}

/**
 * Each replicate divided by its cell constant, referred to the method's reference temperature and
 * resampled onto the method grid — all by the engine. A sweep that does not cover the band is
 * kept with the reason instead of a spectrum (resampling never extrapolates).
 */
export function prepareReplicates(replicates: readonly Replicate[], method: MethodSettings, grid = methodGrid(method)): PreparedReplicate[] {
  return replicates.map((r) => {
    const normalised = normaliseSpectrum(measuredSpectrum(r), {
      cellConstantPerCm: r.cellConstantPerCm,
      temperatureC: r.temperatureC,
      referenceTemperatureC: method.referenceTemperatureC,
      coefficientPerC: method.temperatureCoefficientPerC,
    });
    try {
      return { id: r.id, replicateNumber: r.replicateNumber, spectrum: resample(normalised, grid), coverageProblem: null };
    } catch (err) {
      if (!(err instanceof GridCoverageError)) throw err;
      return { id: r.id, replicateNumber: r.replicateNumber, spectrum: null, coverageProblem: `replicate ${r.replicateNumber} (${r.fileName}): ${err.message}` };
    }
  });
}
