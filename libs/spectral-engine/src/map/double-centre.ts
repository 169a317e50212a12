/** Largest relative asymmetry or diagonal value still read as rounding in a distance matrix. */
const TOLERANCE = 1e-9;

/**
 * Checks a distance matrix (square, finite, non-negative, symmetric, zero diagonal) and returns
 * Torgerson's doubly centred matrix B = −½·J·(D∘D)·J, J = I − 11ᵀ/n, row-major in one array.
 */
export function doubleCentredSquares(distances: readonly (readonly number[])[]): Float64Array {
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
