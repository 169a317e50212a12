import { centredProduct, checkedSquares, doubleCentreInPlace } from './double-centre';
import { allEigenpairs } from './full-eigen';
import { largestEigenpairs } from './lanczos';

/** How the eigenpairs are found: every one (exact GOF), or only the largest (fast for big maps). */
export type MdsMethod = 'auto' | 'full' | 'iterative';

/** Up to this many points `auto` decomposes fully; above it, a full decomposition takes seconds. */
export const FULL_DECOMPOSITION_LIMIT = 150;

export interface MdsOptions {
  /** Default `auto`: `full` up to `FULL_DECOMPOSITION_LIMIT` points, `iterative` above. */
  readonly method?: MdsMethod;
}

/** R's goodness of fit (`cmdscale(..., eig = TRUE)$GOF`). */
export interface MdsGoodnessOfFit {
  /** Σ of the `dims` largest eigenvalues / Σ |λ| over all eigenvalues. */
  readonly absolute: number;
  /** Σ of the `dims` largest eigenvalues / Σ max(λ, 0). */
  readonly positive: number;
}

export interface MdsResult {
  /** One row per point, `dims` columns, in the distances' unit; an axis with λ ≤ 0 (to rounding) is all zeros. */
  readonly coordinates: number[][];
  /** Descending: all n eigenvalues (`full`), or the `dims` largest (`iterative`); unit squared. */
  readonly eigenvalues: number[];
  readonly method: 'full' | 'iterative';
  /** Number of the `dims` axes with a positive eigenvalue (the axes that carry the map). */
  readonly positiveAxes: number;
  /** Null when only the largest eigenvalues were computed. */
  readonly goodnessOfFit: MdsGoodnessOfFit | null;
  /**
   * Negative eigenvalues show how far the distances are from Euclidean; null when only the
   * largest were computed. `count` ignores rounding-level values.
   */
  readonly negativeEigenvalues: { readonly count: number; readonly sumOfMagnitudes: number } | null;
  /** The smallest eigenvalue (exact in `full`; a Lanczos estimate in `iterative`, never below the true one). */
  readonly smallestEigenvalue: number;
}

/** Eigenvalues within this share of the largest magnitude count as zero when counting negatives. */
const ZERO_TOLERANCE = 1e-10;

/** Flips an axis so that its largest-magnitude entry is positive, making the map's orientation repeatable. */
function fixSign(v: Float64Array): Float64Array {
  let pivot = 0;
  for (let i = 1; i < v.length; i++) if (Math.abs(v[i]) > Math.abs(v[pivot])) pivot = i;
  return v[pivot] < 0 ? v.map((x) => -x) : v;
}

/**
 * Classical (Torgerson–Gower) multidimensional scaling of a symmetric distance matrix, as R's
 * `cmdscale(d, k = dims, eig = TRUE)`: coordinates from the `dims` largest eigenpairs of the
 * doubly centred squared distances; negative eigenvalues are reported, not hidden. Axis signs
 * are arbitrary in the method; here each axis's largest entry is positive.
 */
export function classicalMds(distances: readonly (readonly number[])[], dims: number, options: MdsOptions = {}): MdsResult {
  const n = distances.length;
  if (!(Number.isInteger(dims) && dims >= 1 && dims <= n - 1)) {
    throw new RangeError(`classical MDS: dims must be a whole number from 1 to n − 1 = ${n - 1}, got ${dims}`);
  }
  const squares = checkedSquares(distances);
  const method = options.method === 'full' || options.method === 'iterative' ? options.method : n <= FULL_DECOMPOSITION_LIMIT ? 'full' : 'iterative';
  let eigenvalues: number[];
  let axes: Float64Array[];
  let goodnessOfFit: MdsGoodnessOfFit | null = null;
  let negativeEigenvalues: MdsResult['negativeEigenvalues'] = null;
  let smallestEigenvalue: number;
  if (method === 'full') {
    const all = allEigenpairs(doubleCentreInPlace(squares, n), n);
    eigenvalues = all.values;
    axes = all.vectors.slice(0, dims);
    const leading = eigenvalues.slice(0, dims).reduce((s, x) => s + x, 0);
    const absolute = eigenvalues.reduce((s, x) => s + Math.abs(x), 0);
    const positive = eigenvalues.reduce((s, x) => s + Math.max(x, 0), 0);
    goodnessOfFit = { absolute: leading / absolute, positive: leading / positive };
    const zero = ZERO_TOLERANCE * Math.max(...eigenvalues.map(Math.abs));
    const negatives = eigenvalues.filter((x) => x < -zero);
    negativeEigenvalues = { count: negatives.length, sumOfMagnitudes: negatives.reduce((s, x) => s - x, 0) };
    smallestEigenvalue = eigenvalues[n - 1];
  } else {
    const top = largestEigenpairs(centredProduct(squares, n), n, dims);
    eigenvalues = top.values;
    axes = top.vectors;
    // B always has the eigenvalue 0 (the centring direction), so the smallest is at most 0.
    smallestEigenvalue = Math.min(0, top.smallest);
  }
  // Rounding leaves ±1e-15-sized eigenvalues where the true value is 0: such an axis is flat, not a direction.
  const scale = Math.max(...eigenvalues.map(Math.abs));
  const carries = (lambda: number) => lambda > ZERO_TOLERANCE * scale;
  const columns = axes.map((v, k) => {
    const lambda = eigenvalues[k];
    return carries(lambda) ? fixSign(v).map((x) => x * Math.sqrt(lambda)) : new Float64Array(n);
  });
  const coordinates = Array.from({ length: n }, (_, i) => columns.map((c) => c[i]));
  const positiveAxes = eigenvalues.slice(0, dims).filter(carries).length;
  return { coordinates, eigenvalues, method, positiveAxes, goodnessOfFit, negativeEigenvalues, smallestEigenvalue };
}

/**
 * Each eigenvalue's share of the spread the map could show: λₖ / Σ max(λ, 0), as the positive
 * goodness of fit of `cmdscale` splits by axis; a flat axis (λ ≤ 0) has share 0. Needs every
 * eigenvalue (`complete`), else returns null.
 */
export function axisShares(eigenvalues: readonly number[], complete: boolean): number[] | null {
  if (!complete) return null;
  const positive = eigenvalues.reduce((s, x) => s + Math.max(x, 0), 0);
  if (!(positive > 0)) return eigenvalues.map(() => 0);
  return eigenvalues.map((x) => Math.max(x, 0) / positive);
}
