import { cholesky, choleskySolve } from './symmetric-solve';

/**
 * Below this, a pivot of the unit-diagonal (correlation-like) matrix JₛᵀJₛ means a column of the
 * scaled Jacobian is, to within 1e−6 of its length, a combination of the others: the parameters
 * are not identifiable. Finite-difference Jacobians carry errors near 1e−10 relative, well below it.
 */
const PIVOT_FLOOR = 1e-12;

/**
 * s²(JᵀJ)⁻¹ computed on the column-scaled Jacobian Jₛ = J·D⁻¹ (D = the columns' norms) and mapped
 * back, D⁻¹(JₛᵀJₛ)⁻¹D⁻¹·s², so the result is in the parameters' own units while the singularity
 * test sees a problem where every parameter counts alike, as in log-parameters. Null when a column
 * is zero or dependent on the others.
 * @param jac column-major, `rows` × `k`
 */
export function scaledCovariance(jac: Float64Array, rows: number, k: number, s2: number): Float64Array | null {
  const norms = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    let sum = 0;
    for (let i = 0; i < rows; i++) sum += jac[j * rows + i] ** 2;
    norms[j] = Math.sqrt(sum);
    if (!(norms[j] > 0) || !Number.isFinite(norms[j])) return null;
  }
  const a = new Float64Array(k * k);
  for (let r = 0; r < k; r++) {
    for (let c = 0; c <= r; c++) {
      let sum = 0;
      for (let i = 0; i < rows; i++) sum += jac[r * rows + i] * jac[c * rows + i];
      const scaled = sum / (norms[r] * norms[c]);
      a[r * k + c] = scaled;
      a[c * k + r] = scaled;
    }
  }
  const l = new Float64Array(k * k);
  if (!cholesky(a, k, l)) return null;
  for (let j = 0; j < k; j++) if (!(l[j * k + j] ** 2 > PIVOT_FLOOR)) return null;
  const covariance = new Float64Array(k * k);
  const e = new Float64Array(k);
  const column = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    e.fill(0);
    e[j] = 1;
    choleskySolve(l, k, e, column);
    for (let i = 0; i < k; i++) covariance[i * k + j] = (s2 * column[i]) / (norms[i] * norms[j]);
  }
  return covariance;
}
