/**
 * `n` frequencies (Hz) spaced evenly in log-frequency from `fMinHz` to `fMaxHz` inclusive,
 * ascending, as numpy's `geomspace`; both ends are exact.
 */
export function logGrid(fMinHz: number, fMaxHz: number, n: number): Float64Array {
  if (!(Number.isFinite(fMinHz) && fMinHz > 0)) throw new RangeError(`log grid: lowest frequency ${fMinHz} Hz must be a positive number`);
  if (!(Number.isFinite(fMaxHz) && fMaxHz > fMinHz)) throw new RangeError(`log grid: highest frequency ${fMaxHz} Hz must be above the lowest (${fMinHz} Hz)`);
  if (!(Number.isInteger(n) && n >= 2)) throw new RangeError(`log grid: needs a whole number of at least 2 points, got ${n}`);
  const lo = Math.log10(fMinHz);
  const step = (Math.log10(fMaxHz) - lo) / (n - 1);
  const grid = new Float64Array(n);
  for (let i = 0; i < n; i++) grid[i] = 10 ** (lo + i * step);
  grid[0] = fMinHz;
  grid[n - 1] = fMaxHz;
  return grid;
}
