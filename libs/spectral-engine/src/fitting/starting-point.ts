import type { Spectrum } from '../spectrum';
import type { ImpedanceModel } from '../models/model-types';
import { resolveModel, type ModelReference } from '../models/resolve-model';
import type { Bounds } from './parameter-transform';
import type { Weighting } from './weighting';

export interface FitOptions {
  /** Residual weighting; default `modulus`. */
  readonly weighting?: Weighting;
  /** Starting values by name; parameters not given start from the model's guess from the spectrum's shape. */
  readonly initial?: Readonly<Record<string, number>>;
  /** Bounds by name, replacing the catalog's (inclusive; omit a side for unbounded). */
  readonly bounds?: Readonly<Record<string, { readonly lower?: number; readonly upper?: number }>>;
  /**
   * Extra starts around the first one, tried until one confirms the best minimum so far (same χ²);
   * the lowest χ² wins. Default 3.
   */
  readonly restarts?: number;
  /** Minimiser iterations per start; default 200. */
  readonly maxIterations?: number;
}

export function boundsOf(model: ImpedanceModel, options: FitOptions): Bounds[] {
  return model.parameters.map((p) => {
    const override = options.bounds?.[p.name];
    const lower = override ? (override.lower ?? -Infinity) : (p.lower ?? -Infinity);
    const upper = override ? (override.upper ?? Infinity) : (p.upper ?? Infinity);
    if (!(lower < upper)) throw new RangeError(`bounds of '${p.name}' are empty: lower ${lower} is not below upper ${upper}`);
    return { lower, upper };
  });
}

export function startingPoint(model: ImpedanceModel, s: Spectrum, bounds: Bounds[], options: FitOptions): Float64Array {
  const guess = model.initialGuess?.(s) ?? new Float64Array(model.parameters.length).fill(1);
  return Float64Array.from(model.parameters, (p, j) => {
    const given = options.initial?.[p.name];
    const v = given ?? guess[j];
    const { lower, upper } = bounds[j];
    if (Number.isFinite(v)) return Math.min(upper, Math.max(lower, v));
    if (Number.isFinite(lower) && Number.isFinite(upper)) return (lower + upper) / 2;
    return Number.isFinite(lower) ? lower + 1 : Number.isFinite(upper) ? upper - 1 : 0;
  });
}

/**
 * The values a fit would start from: the model's guess from the spectrum's shape (apex of the
 * arc, plateaus, slope of log |Z″|), overridden by `options.initial`, clipped into the bounds.
 * @returns parameter values by name, in the catalog's units
 */
export function guessParameters(s: Spectrum, model: ModelReference, options: FitOptions = {}): Record<string, number> {
  const m = resolveModel(model);
  const start = startingPoint(m, s, boundsOf(m, options), options);
  return Object.fromEntries(m.parameters.map((p, j) => [p.name, start[j]]));
}
