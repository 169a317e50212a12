/** Largest relative asymmetry or diagonal value still read as rounding in a distance matrix. */
const TOLERANCE = 1e-9;

/**
 * Checks a distance matrix (square, finite, non-negative, symmetric, zero diagonal) and returns
 * Torgerson's doubly centred matrix B = −½·J·(D∘D)·J, J = I − 11ᵀ/n, row-major in one array.
 */
export function doubleCentredSquares(distances: readonly (readonly number[])[]): Float64Array {
  const n = distances.length;
  let largest = 0;
  for (let i = 0; i < n; i++) {
    const row = distances[i];
    if (row.length !== n) throw new RangeError(`distance matrix: row ${i + 1} has ${row.length} entries; a ${n}-point matrix needs ${n}`);
    for (let j = 0; j < n; j++) {
      const d = row[j];
      if (!(d >= 0 && d < Infinity)) throw new RangeError(`distance matrix: entry (${i + 1}, ${j + 1}) is ${d}; distances must be finite and not negative`);
      if (d > largest) largest = d;
    }
  }
  const slack = TOLERANCE * largest;
  for (let i = 0; i < n; i++) {
    if (distances[i][i] > slack) throw new RangeError(`distance matrix: diagonal entry (${i + 1}, ${i + 1}) is ${distances[i][i]}; a point's distance to itself must be 0`);
    for (let j = i + 1; j < n; j++) {
      if (Math.abs(distances[i][j] - distances[j][i]) > slack) {
        throw new RangeError(`distance matrix: entries (${i + 1}, ${j + 1}) = ${distances[i][j]} and (${j + 1}, ${i + 1}) = ${distances[j][i]} differ; the matrix must be symmetric`);
      }
    }
  }
  const b = new Float64Array(n * n);
  const rowMean = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    // Average the two triangles so rounding-level asymmetry cannot make B unsymmetric.
    for (let j = i; j < n; j++) {
      const d = (distances[i][j] + distances[j][i]) / 2;
      b[i * n + j] = b[j * n + i] = d * d;
    }
  }
  for (let i = 0; i < n; i++) {
    let sum = 0;
    for (let j = 0; j < n; j++) sum += b[i * n + j];
    rowMean[i] = sum / n;
  }
  let grand = 0;
  for (let i = 0; i < n; i++) grand += rowMean[i];
  grand /= n;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) b[i * n + j] = -0.5 * (b[i * n + j] - rowMean[i] - rowMean[j] + grand);
  }
  return b;
}
