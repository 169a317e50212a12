/**
 * Linear least squares min ‖Ax − b‖ by Householder QR, A column-major (rows × cols).
 * QR rather than normal equations: the Kramers–Kronig basis columns are close to collinear when
 * many time constants are used, and forming AᵀA would square that ill-conditioning.
 * A and b are overwritten. Returns x, or null when A is rank-deficient.
 */
export function householderLeastSquares(a: Float64Array, rows: number, cols: number, b: Float64Array): Float64Array | null {
  const diag = new Float64Array(cols);
  let largest = 0;
  for (let k = 0; k < cols; k++) {
    const col = k * rows;
    // Plain sum of squares: the rows are scaled by 1/|Z|, so nothing here comes near overflow.
    let sq = 0;
    for (let i = k; i < rows; i++) sq += a[col + i] * a[col + i];
    const norm = Math.sqrt(sq);
    largest = Math.max(largest, norm);
    if (norm === 0 || norm <= 1e-14 * largest) return null;
    const alpha = a[col + k] > 0 ? -norm : norm;
    a[col + k] -= alpha;
    let vv = 0;
    for (let i = k; i < rows; i++) vv += a[col + i] * a[col + i];
    diag[k] = alpha;
    for (let j = k + 1; j < cols; j++) {
      const cj = j * rows;
      let dot = 0;
      for (let i = k; i < rows; i++) dot += a[col + i] * a[cj + i];
      const f = (2 * dot) / vv;
      for (let i = k; i < rows; i++) a[cj + i] -= f * a[col + i];
    }
    let dot = 0;
    for (let i = k; i < rows; i++) dot += a[col + i] * b[i];
    const f = (2 * dot) / vv;
    for (let i = k; i < rows; i++) b[i] -= f * a[col + i];
  }
  const x = new Float64Array(cols);
  for (let k = cols - 1; k >= 0; k--) {
    let s = b[k];
    for (let j = k + 1; j < cols; j++) s -= a[j * rows + k] * x[j];
    x[k] = s / diag[k];
  }
  return x;
}
