import { cellConstantFromStandard, fitModel, type Spectrum } from '@ohmprint/spectral-engine';
import { ApiError } from '../../core/api-error';

/**
 * The standard's resistance from its spectrum: the median real part where the phase is within 1°
 * of 0° (the resistive plateau); without such a plateau, R of an R + CPE fit over the whole sweep.
 */
export function standardResistance(spectrum: Spectrum): { resistanceOhm: number; source: 'plateau' | 'fit'; how: string } {
  try {
    const c = cellConstantFromStandard(spectrum, { standardConductivityUSPerCm: 1 });
    return { resistanceOhm: c.plateauResistanceOhm, source: 'plateau', how: `plateau of ${c.plateauFrequenciesHz.length} point(s) with |phase| ≤ 1°` };
  } catch (err) {
    if (!(err instanceof RangeError)) throw err;
  }
  const fit = fitModel(spectrum, 'r-cpe', { restarts: 1 });
  if (!fit.converged) throw ApiError.badRequest(`The standard's spectrum has no resistive plateau and an R + CPE fit did not converge (${fit.reason}).`, [{ field: 'file', message: 'no plateau and no usable fit' }]);
  return { resistanceOhm: fit.parameters.r, source: 'fit', how: 'R of an R + CPE fit (no point within 1° of 0°)' };
}
