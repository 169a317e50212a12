import type { Spectrum } from '../spectrum';

/** One adjustable parameter of an impedance model. Bounds are inclusive; null = unbounded. */
export interface ModelParameter {
  readonly name: string;
  /** Unit as shown to people, e.g. "Ω", "s", "S·sⁿ", "1" for dimensionless. */
  readonly unit: string;
  readonly description: string;
  readonly lower: number | null;
  readonly upper: number | null;
}

/** What the portals show about a model: serialisable, no functions. */
export interface ModelDescription {
  readonly name: string;
  readonly label: string;
  /** The formula in words and symbols, ω = 2πf in rad/s. */
  readonly formula: string;
  readonly parameters: readonly ModelParameter[];
}

/**
 * An impedance model ready to evaluate: parameters in the order of `parameters`,
 * angular frequencies ω in rad/s, impedance written in ohms into `re` and `im`.
 */
export interface ImpedanceModel extends ModelDescription {
  evaluate(parameters: Float64Array, omega: Float64Array, re: Float64Array, im: Float64Array): void;
  /**
   * Analytic ∂Z/∂p, when the model has them: column j of `dRe`/`dIm` (offset j·ω.length) holds
   * the derivative by parameter j. Also writes Z itself into `re`/`im`. Saves the fitter the
   * extra evaluations of a finite-difference Jacobian.
   */
  derivatives?(parameters: Float64Array, omega: Float64Array, re: Float64Array, im: Float64Array, dRe: Float64Array, dIm: Float64Array): void;
  /** A starting point read from the spectrum's shape (parameters in order), when the model has one. */
  initialGuess?(spectrum: Spectrum): Float64Array;
}
