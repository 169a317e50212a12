import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** Ritz pairs are accepted once their residual is this small relative to the largest eigenvalue. */
const RESIDUAL_TOLERANCE = 1e-10;

export interface ExtremeEigenpairs {
  /** The `count` largest eigenvalues, descending, and their unit eigenvectors. */
  readonly values: number[];
  readonly vectors: Float64Array[];
  /** Ritz estimate of the smallest eigenvalue: never below the true one. */
  readonly smallest: number;
  /** Lanczos steps taken in the last pass. */
  readonly steps: number;
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * y[i];
  return s;
}

/** A fixed pseudo-random start, so the same matrix always gives the same axes. */
function startVector(n: number): Float64Array {
  const v = new Float64Array(n);
  let state = 0x2545f491;
  for (let i = 0; i < n; i++) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    v[i] = state / 2 ** 32 - 0.5;
  }
  const length = Math.sqrt(dot(v, v));
  return v.map((x) => x / length);
}

/** Steps between two looks at the Ritz values: each look costs an eigen-decomposition of the small tridiagonal matrix. */
const CHECK_EVERY = 2;

function ritzPairs(alpha: number[], beta: number[]) {
  const m = alpha.length;
  const t = Matrix.zeros(m, m);
  for (let i = 0; i < m; i++) {
    t.set(i, i, alpha[i]);
    if (i + 1 < m) {
      t.set(i, i + 1, beta[i]);
      t.set(i + 1, i, beta[i]);
    }
  }
  const ritz = new EigenvalueDecomposition(t, { assumeSymmetric: true });
  const theta = ritz.realEigenvalues;
  const order = theta.map((_, i) => i).sort((i, j) => theta[j] - theta[i]);
  return { theta, vectors: ritz.eigenvectorMatrix, order };
}

/** A symmetric n × n operator given by its product: writes M·x into `out`. */
export type SymmetricProduct = (x: Float64Array, out: Float64Array) => void;

/**
 * The largest `count` eigenpairs of a symmetric operator by the Lanczos method with full
 * reorthogonalisation: each step costs one matrix–vector product, so a 2,000-point map needs a
 * dozen or two passes over the matrix instead of a full O(n³) decomposition.
 */
export function largestEigenpairs(multiply: SymmetricProduct, n: number, count: number): ExtremeEigenpairs {
  const firstCheck = Math.min(n, count + 4);
  const basis: Float64Array[] = [startVector(n)];
  const alpha: number[] = [];
  const beta: number[] = [];
  const w = new Float64Array(n);
  for (let j = 0; ; j++) {
    multiply(basis[j], w);
    alpha.push(dot(basis[j], w));
    // Two rounds of Gram–Schmidt keep the basis orthogonal to working precision.
    for (let round = 0; round < 2; round++) {
      for (const q of basis) {
        const c = dot(q, w);
        for (let i = 0; i < n; i++) w[i] -= c * q[i];
      }
    }
    const norm = Math.sqrt(dot(w, w));
    beta.push(norm);
    const m = j + 1;
    const exhausted = norm < 1e-13 * Math.max(1, Math.abs(alpha[0])) || m === n;
    if (exhausted || (m >= firstCheck && (m - firstCheck) % CHECK_EVERY === 0)) {
      const { theta, vectors: s, order } = ritzPairs(alpha, beta);
      const top = order.slice(0, Math.min(count, m));
      const scale = Math.max(...theta.map(Math.abs), Number.MIN_VALUE);
      // The residual of a Ritz pair is |β_m · (last component of its tridiagonal eigenvector)|.
      const converged = top.every((i) => Math.abs(norm * s.get(m - 1, i)) <= RESIDUAL_TOLERANCE * scale);
      if (exhausted || converged) {
        const vectors = top.map((i) => {
          const v = new Float64Array(n);
          for (let k = 0; k < m; k++) {
            const c = s.get(k, i);
            const q = basis[k];
            for (let r = 0; r < n; r++) v[r] += c * q[r];
          }
          const length = Math.sqrt(dot(v, v));
          return v.map((x) => x / length);
        });
        const values = top.map((i) => theta[i]);
        // A Krylov space that closes early has found every eigenvalue the start reaches; the rest are zero.
        while (values.length < count) {
          values.push(0);
          vectors.push(new Float64Array(n));
        }
        return { values, vectors, smallest: theta[order[order.length - 1]], steps: m };
      }
    }
    basis.push(w.map((x) => x / norm));
  }
}
