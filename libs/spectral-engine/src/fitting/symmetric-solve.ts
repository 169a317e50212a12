/*
 * Cholesky factorisation for the small symmetric positive-definite systems of the fitter
 * (one row per model parameter, so at most a handful). Row-major n×n Float64Arrays.
 */

/** Factorises A = LLᵀ in place into `l`; false when A is not positive definite. */
export function cholesky(a: Float64Array, n: number, l: Float64Array): boolean {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = a[i * n + j];
      for (let k = 0; k < j; k++) sum -= l[i * n + k] * l[j * n + k];
      if (i === j) {
        if (!(sum > 0)) return false;
        l[i * n + i] = Math.sqrt(sum);
      } else {
        l[i * n + j] = sum / l[j * n + j];
      }
    }
    for (let j = i + 1; j < n; j++) l[i * n + j] = 0;
  }
  return true;
}

/** Solves LLᵀx = b given the factor, writing x. */
export function choleskySolve(l: Float64Array, n: number, b: Float64Array, x: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let sum = b[i];
    for (let k = 0; k < i; k++) sum -= l[i * n + k] * x[k];
    x[i] = sum / l[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let sum = x[i];
    for (let k = i + 1; k < n; k++) sum -= l[k * n + i] * x[k];
    x[i] = sum / l[i * n + i];
  }
}

/** Inverse of a symmetric positive-definite matrix, or null when it is singular. */
export function symmetricInverse(a: Float64Array, n: number): Float64Array | null {
  const l = new Float64Array(n * n);
  if (!cholesky(a, n, l)) return null;
  const inv = new Float64Array(n * n);
  const e = new Float64Array(n);
  const col = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    e.fill(0);
    e[j] = 1;
    choleskySolve(l, n, e, col);
    for (let i = 0; i < n; i++) inv[i * n + j] = col[i];
  }
  return inv;
}
