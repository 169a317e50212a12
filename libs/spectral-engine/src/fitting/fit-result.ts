import type { Weighting } from './weighting';

/** A fit that converged: parameter values with their uncertainties and the goodness of fit. */
export interface FitSuccess {
  readonly converged: true;
  readonly model: string;
  readonly weighting: Weighting;
  /** Parameter names in the model's order; the covariance rows follow it. */
  readonly parameterNames: readonly string[];
  /** Fitted values in the catalog's units. */
  readonly parameters: Readonly<Record<string, number>>;
  /**
   * One standard error per parameter, √diag(s²(JᵀJ)⁻¹) with s² = χ²/(2N − p), in the parameter's
   * units; 0 for a parameter held on a bound (see parametersAtBound).
   */
  readonly standardErrors: Readonly<Record<string, number>>;
  readonly covariance: readonly (readonly number[])[];
  /**
   * Parameters that rest on a bound at the optimum (a CPE exponent of 1, a resistance driven to 0):
   * held there as a constrained fit holds them, with no uncertainty of their own.
   */
  readonly parametersAtBound: readonly string[];
  /** Σ of squared weighted residuals (dimensionless for modulus/proportional weighting, Ω² for unit). */
  readonly chiSquare: number;
  /** χ²/(2N − p). */
  readonly reducedChiSquare: number;
  readonly degreesOfFreedom: number;
  /** Root-mean-square residual of real and imaginary parts, in % of |Z|. */
  readonly residualPct: number;
  /** Largest absolute residual, in % of |Z|. */
  readonly maxAbsResidualPct: number;
  /** (Z′ − Ẑ′)/|Z| and (Z″ − Ẑ″)/|Z| in %, per frequency (ascending). */
  readonly residualsRePct: Float64Array;
  readonly residualsImPct: Float64Array;
  /** Minimiser iterations of the chosen start. */
  readonly iterations: number;
  /** Why the minimiser stopped. */
  readonly reason: string;
}

/** A fit that did not converge: no parameter values are offered, only why. */
export interface FitFailure {
  readonly converged: false;
  readonly model: string;
  readonly weighting: Weighting;
  readonly parameterNames: readonly string[];
  readonly parameters: null;
  readonly standardErrors: null;
  readonly chiSquare: null;
  readonly residualPct: null;
  readonly iterations: number;
  readonly reason: string;
}

export type FitResult = FitSuccess | FitFailure;
