/** Largest relative asymmetry or diagonal value still read as rounding in a distance matrix. */
const TOLERANCE = 1e-9;

/**
 * Checks a distance matrix (square, finite, non-negative, symmetric, zero diagonal) and returns
 * its squares A = D∘D, exactly symmetric, row-major in one array.
 */
export function checkedSquares(distances: readonly (readonly number[])[]): Float64Array {
  const n = distances.length;
  const b = new Float64Array(n * n);
  let largest = 0;
  for (let i = 0, base = 0; i < n; i++, base += n) {
    const row = distances[i];
    if (row.length !== n) throw new RangeError(`distance matrix: row ${i + 1} has ${row.length} entries; a ${n}-point matrix needs ${n}`);
    for (let j = 0; j < n; j++) {
      const d = row[j];
      if (!(d >= 0 && d < Infinity)) throw new RangeError(`distance matrix: entry (${i + 1}, ${j + 1}) is ${d}; distances must be finite and not negative`);
      if (d > largest) largest = d;
      b[base + j] = d * d;
    }
  }
  const slack = TOLERANCE * largest;
  for (let i = 0; i < n; i++) {
    if (distances[i][i] > slack) throw new RangeError(`distance matrix: diagonal entry (${i + 1}, ${i + 1}) is ${distances[i][i]}; a point's distance to itself must be 0`);
    b[i * n + i] = 0;
    for (let j = i + 1; j < n; j++) {
      const dij = distances[i][j];
      const dji = distances[j][i];
      if (dij !== dji) {
        if (Math.abs(dij - dji) > slack) {
          throw new RangeError(`distance matrix: entries (${i + 1}, ${j + 1}) = ${dij} and (${j + 1}, ${i + 1}) = ${dji} differ; the matrix must be symmetric`);
        }
        // Rounding-level asymmetry is averaged away so B stays exactly symmetric.
        b[i * n + j] = b[j * n + i] = (b[i * n + j] + b[j * n + i]) / 2;
      }
    }
  }
  return b;
}

/**
 * Applies B = −½·J·A·J to x without forming B: B·x = −½·(y − ȳ·1) with y = A·(x − x̄·1), which saves
 * two passes over the n × n matrix when only matrix–vector products are needed.
 */
export function centredProduct(a: Float64Array, n: number): (x: Float64Array, out: Float64Array) => void {
  const centred = new Float64Array(n);
  return (x, out) => {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += x[i];
    mean /= n;
    for (let i = 0; i < n; i++) centred[i] = x[i] - mean;
    multiply(a, n, centred, out);
    let outMean = 0;
    for (let i = 0; i < n; i++) outMean += out[i];
    outMean /= n;
    for (let i = 0; i < n; i++) out[i] = -0.5 * (out[i] - outMean);
  };
}

/** out = A·x for a row-major n × n matrix. */
function multiply(a: Float64Array, n: number, x: Float64Array, out: Float64Array): void {
  for (let i = 0, base = 0; i < n; i++, base += n) {
    // Four running sums let the CPU overlap the multiply–adds of one row.
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    let j = 0;
    for (; j + 3 < n; j += 4) {
      s0 += a[base + j] * x[j];
      s1 += a[base + j + 1] * x[j + 1];
      s2 += a[base + j + 2] * x[j + 2];
      s3 += a[base + j + 3] * x[j + 3];
    }
    for (; j < n; j++) s0 += a[base + j] * x[j];
    out[i] = s0 + s1 + (s2 + s3);
  }
}

/**
 * Turns squared distances A (row-major, symmetric) in place into Torgerson's doubly centred
 * matrix B = −½·J·A·J, J = I − 11ᵀ/n, and returns it.
 */
export function doubleCentreInPlace(b: Float64Array, n: number): Float64Array {
  const rowMean = new Float64Array(n);
  let grand = 0;
  for (let i = 0, base = 0; i < n; i++, base += n) {
    let sum = 0;
    for (let j = 0; j < n; j++) sum += b[base + j];
    rowMean[i] = sum / n;
    grand += rowMean[i];
  }
  grand /= n;
  for (let i = 0, base = 0; i < n; i++, base += n) {
    const ri = rowMean[i] - grand;
    for (let j = 0; j < n; j++) b[base + j] = -0.5 * (b[base + j] - ri - rowMean[j]);
  }
  return b;
}
