/** Largest number of library spectra sampled to rank the terms; enough to rank, cheap at any size. */
const SAMPLE_SIZE = 512;

/**
 * Ranks the 2N Canberra terms of packed rows (`width` values per spectrum: real parts, then
 * imaginary) by how much they separate library spectra, largest first. The leading terms make the
 * index's sentinels: their partial sum passes the current k-th best distance for most spectra.
 * The ranking only speeds the search; results do not depend on it.
 */
export function rankTermsBySpread(packed: Float64Array, count: number, width: number): Int32Array {
  const spread = new Float64Array(width);
  const step = Math.max(1, Math.floor(count / SAMPLE_SIZE));
  for (let r = 0; r + step < count; r += step) {
    const a = r * width;
    const b = (r + step) * width;
    for (let t = 0; t < width; t++) {
      const x = packed[a + t];
      const y = packed[b + t];
      const den = Math.abs(x) + Math.abs(y);
      if (den > 0) spread[t] += Math.abs(x - y) / den;
    }
  }
  const order = Array.from({ length: width }, (_, t) => t);
  order.sort((s, t) => spread[t] - spread[s] || s - t);
  return Int32Array.from(order);
}
