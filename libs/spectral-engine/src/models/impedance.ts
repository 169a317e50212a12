import type { Spectrum } from '../spectrum';
import { resolveModel, type ModelReference } from './resolve-model';
import { angularFrequencies } from './shape-features';

/**
 * Evaluates a model at the given frequencies.
 * @param model built-in name (see MODEL_CATALOG), lab-defined expression, or a defined model
 * @param parameters values by parameter name, in the units of the catalog (Ω, s, S·sⁿ, …)
 * @param frequencyHz frequencies in hertz, ascending
 * @returns the model spectrum in ohms
 * @throws RangeError when a parameter is missing, unknown or not finite
 */
export function impedance(model: ModelReference, parameters: Readonly<Record<string, number>>, frequencyHz: Float64Array): Spectrum {
  const m = resolveModel(model);
  const names = m.parameters.map((p) => p.name);
  for (const key of Object.keys(parameters)) {
    if (!names.includes(key)) throw new RangeError(`model '${m.name}' has no parameter '${key}' (it has ${names.join(', ')})`);
  }
  const p = Float64Array.from(names, (name) => {
    const v = parameters[name];
    if (v === undefined) throw new RangeError(`model '${m.name}' needs parameter '${name}'`);
    if (!Number.isFinite(v)) throw new RangeError(`parameter '${name}' must be a finite number, got ${v}`);
    return v;
  });
  const re = new Float64Array(frequencyHz.length);
  const im = new Float64Array(frequencyHz.length);
  m.evaluate(p, angularFrequencies(frequencyHz), re, im);
  return { frequencyHz: Float64Array.from(frequencyHz), re, im };
}
