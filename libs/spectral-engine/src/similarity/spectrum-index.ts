import type { Spectrum } from '../spectrum';
import { assertFiniteValues } from '../statistics/finite-values';
import { assertSameFrequencies, assertWellFormed } from './same-grid';
import { rankTermsBySpread } from './term-order';

/** One search hit: the reference's position in the library and its `spectrumDistance` (0…1). */
export interface Neighbour {
  readonly index: number;
  readonly distance: number;
}

/** A reference library packed for repeated nearest-neighbour searches. */
export interface SpectrumIndex {
  /** Number of reference spectra. */
  readonly size: number;
  /** The grid every reference (and every query) is on, Hz ascending. */
  readonly frequencyHz: Float64Array;
  /** Bytes held by the index's arrays. */
  readonly byteLength: number;
  /**
   * The k references nearest to `sample` by `spectrumDistance`, nearest first; ties go to the
   * lower library position. Exactly the result of a full scan, however much is pruned.
   */
  nearest(sample: Spectrum, k: number): Neighbour[];
}

/** Terms summed between two checks of a partial sum against the current k-th best. */
const BLOCK = 8;
/**
 * Partial sums are taken in another order than the distance itself, so the two differ by
 * rounding (≤ 2N·ε relative); the bound they are compared with gets this margin.
 */
const ROUNDING_MARGIN = 1e-12;
/**
 * Pivot spectra per index. The Canberra distance is a metric, so for every pivot p
 * d(q, r) ≥ |d(q, p) − d(r, p)|: with d(r, p) stored at build time, one subtraction per pivot
 * bounds a spectrum's distance from below without reading it. Pivots pay on a broad library
 * (spectra far apart); the leading terms of the partial sum on a tight one.
 */
const PIVOTS = 8;
/** Library spectra sampled to choose the pivots (farthest-first among them). */
const PIVOT_SAMPLE = 1024;
/**
 * Sums of up to 2N terms (each in [0, 1]) carry rounding of about 2N·ε·2N; a pivot bound must
 * pass the k-th best by more than this (in sum units) to rule a spectrum out.
 */
const PIVOT_MARGIN = 1e-9;

/** One Canberra term; both zero only when the difference is zero too, so dividing by 1 then adds SciPy's 0. */
const term = (x: number, y: number): number => Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);

/** The unscaled Canberra sum of `a` (from `aBase`) and `b` (from `bBase`) over `width` terms, in storage order. */
function storedSum(a: Float64Array, aBase: number, b: Float64Array, bBase: number, width: number): number {
  let sum = 0;
  for (let t = 0; t < width; t++) sum += term(a[aBase + t], b[bBase + t]);
  return sum;
}

/**
 * Pivots chosen farthest-first among a sample of the library (each the sample spectrum farthest
 * from the pivots so far), so they look at the library from different sides; then every
 * spectrum's distance to each pivot. The choice only speeds the search; results do not depend on it.
 */
function choosePivots(body: Float64Array, count: number, width: number): { pivots: Int32Array; distances: Float64Array } {
  const wanted = Math.min(PIVOTS, count);
  const step = Math.max(1, Math.floor(count / PIVOT_SAMPLE));
  const sample: number[] = [];
  for (let r = 0; r < count && sample.length < PIVOT_SAMPLE; r += step) sample.push(r);
  const nearestPivot = new Float64Array(sample.length).fill(Infinity);
  const pivots = new Int32Array(wanted);
  let next = sample[0];
  for (let p = 0; p < wanted; p++) {
    pivots[p] = next;
    let farthest = -1;
    for (let i = 0; i < sample.length; i++) {
      const d = storedSum(body, pivots[p] * width, body, sample[i] * width, width);
      if (d < nearestPivot[i]) nearestPivot[i] = d;
      if (nearestPivot[i] > farthest) {
        farthest = nearestPivot[i];
        next = sample[i];
      }
    }
  }
  const distances = new Float64Array(count * wanted);
  for (let r = 0; r < count; r++) {
    for (let p = 0; p < wanted; p++) distances[r * wanted + p] = storedSum(body, pivots[p] * width, body, r * width, width);
  }
  return { pivots, distances };
}

/**
 * The library as one contiguous Float64Array (`body`, 2N values per spectrum) with each
 * spectrum's terms stored in the order that separates library spectra most (`order`), so a
 * partial sum passes the current k-th best after a few terms for most spectra; plus a few pivot
 * spectra and every spectrum's distance to them, for a lower bound that rules spectra out without
 * reading them. A spectrum that survives both gets its distance summed exactly as
 * `spectrumDistance` sums it (real parts, then imaginary, in frequency order), so distances are
 * identical to a full scan's.
 */
class PackedSpectrumIndex implements SpectrumIndex {
  private readonly width: number;
  private readonly half: number;
  /** stored position of each canonical term (re[0…N−1], then im[0…N−1]). */
  private readonly position: Int32Array;

  constructor(
    readonly frequencyHz: Float64Array,
    readonly size: number,
    private readonly body: Float64Array,
    /** canonical term stored at each position. */
    private readonly order: Int32Array,
    /** Row numbers of the pivot spectra in `body`. */
    private readonly pivots: Int32Array,
    /** d(r, pivot) as unscaled Canberra sums, `pivots.length` per spectrum. */
    private readonly pivotDistances: Float64Array,
  ) {
    this.half = frequencyHz.length;
    this.width = 2 * this.half;
    this.position = new Int32Array(this.width);
    order.forEach((canonical, stored) => (this.position[canonical] = stored));
  }

  get byteLength(): number {
    return this.body.byteLength + this.order.byteLength + this.position.byteLength + this.frequencyHz.byteLength + this.pivots.byteLength + this.pivotDistances.byteLength;
  }

  /** The distance as spectrumDistance sums it, unscaled: real terms in order, imaginary terms in order, then added. */
  private exactSum(query: Float64Array, r: number): number {
    const { body, position, half, width } = this;
    const base = r * width;
    let re = 0;
    for (let j = 0; j < half; j++) re += term(query[j], body[base + position[j]]);
    let im = 0;
    for (let j = half; j < width; j++) im += term(query[j], body[base + position[j]]);
    return re + im;
  }

  nearest(sample: Spectrum, k: number): Neighbour[] {
    if (!Number.isInteger(k) || k < 1) throw new RangeError(`nearest: k must be a whole number of at least 1, got ${k}`);
    assertWellFormed(sample, 'the sample');
    assertSameFrequencies(this.frequencyHz, sample.frequencyHz, 'the reference library', 'the sample');
    assertFiniteValues(sample.re, 're', 'the sample');
    assertFiniteValues(sample.im, 'im', 'the sample');
    const { width, half, body, order, size, pivots } = this;
    const wanted = Math.min(k, size);
    const query = new Float64Array(width);
    query.set(sample.re, 0);
    query.set(sample.im, half);
    const stored = Float64Array.from(order, (canonical) => query[canonical]);
    const queryToPivot = Float64Array.from(pivots, (row) => storedSum(stored, 0, body, row * width, width));

    const bestIndex = new Int32Array(wanted);
    const bestSum = new Float64Array(wanted);
    let found = 0;
    let limit = Infinity;
    /**
     * Keeps the best `wanted` by (distance, position): ties go to the lower library position. Ranked
     * by the distance itself (sum ÷ terms), as a full scan ranks: two sums one ulp apart can be the
     * same distance, and then position decides.
     */
    const offer = (r: number, sum: number): void => {
      const exact = sum / width;
      if (found === wanted && (exact > bestSum[wanted - 1] || (exact === bestSum[wanted - 1] && r > bestIndex[wanted - 1]))) return;
      let slot = found < wanted ? found++ : wanted - 1;
      while (slot > 0 && (bestSum[slot - 1] > exact || (bestSum[slot - 1] === exact && bestIndex[slot - 1] > r))) {
        bestSum[slot] = bestSum[slot - 1];
        bestIndex[slot] = bestIndex[slot - 1];
        slot--;
      }
      bestSum[slot] = exact;
      bestIndex[slot] = r;
      if (found === wanted) limit = bestSum[wanted - 1] * width;
    };
    // Seed the k-th best with the spectra whose pivot bound is lowest, so the pass below starts with
    // a tight limit whatever the library's order.
    const lowerBounds = new Float64Array(size);
    const seeded = this.pivotBounds(queryToPivot, wanted, lowerBounds);
    for (const r of seeded) offer(r, this.exactSum(query, r));
    const isSeeded = new Set(seeded);

    for (let r = 0; r < size; r++) {
      if (lowerBounds[r] > limit + PIVOT_MARGIN) continue;
      // Partial sums of non-negative terms only grow: abandon once past the k-th best, most
      // separating terms first.
      const base = r * width;
      const cut = limit * (1 + ROUNDING_MARGIN);
      let partial = 0;
      for (let start = 0; start < width && partial <= cut; start += BLOCK) {
        const end = start + BLOCK < width ? start + BLOCK : width;
        for (let t = start; t < end; t++) {
          const x = stored[t];
          const y = body[base + t];
          partial += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
        }
      }
      if (partial > cut || isSeeded.has(r)) continue;
      offer(r, this.exactSum(query, r));
    }
    return Array.from({ length: found }, (_, i) => ({ index: bestIndex[i], distance: bestSum[i] }));
  }

  /**
   * Writes every spectrum's pivot lower bound max_p |d(q, p) − d(r, p)| into `lowerBounds` and
   * returns the `k` rows where it is lowest (the spectra most likely nearest).
   */
  private pivotBounds(queryToPivot: Float64Array, k: number, lowerBounds: Float64Array): number[] {
    const { pivotDistances, size } = this;
    const pivotCount = queryToPivot.length;
    const rows = new Int32Array(k);
    const bounds = new Float64Array(k).fill(Infinity);
    let filled = 0;
    for (let r = 0; r < size; r++) {
      let lower = 0;
      for (let p = 0; p < pivotCount; p++) {
        const gap = Math.abs(queryToPivot[p] - pivotDistances[r * pivotCount + p]);
        if (gap > lower) lower = gap;
      }
      lowerBounds[r] = lower;
      if (filled === k && lower >= bounds[k - 1]) continue;
      let slot = filled < k ? filled++ : k - 1;
      while (slot > 0 && bounds[slot - 1] > lower) {
        bounds[slot] = bounds[slot - 1];
        rows[slot] = rows[slot - 1];
        slot--;
      }
      bounds[slot] = lower;
      rows[slot] = r;
    }
    return Array.from(rows.subarray(0, filled));
  }
}

/**
 * Packs a reference library (spectra on one grid, impedances in Ω) into contiguous
 * Float64Arrays for fast top-k search by `spectrumDistance`. The library is copied, so later
 * changes to the spectra do not reach the index.
 */
export function createSpectrumIndex(references: readonly Spectrum[]): SpectrumIndex {
  if (references.length === 0) throw new RangeError('a spectrum index needs at least one reference spectrum');
  const first = references[0];
  references.forEach((s, r) => {
    const name = `reference ${r + 1}`;
    assertWellFormed(s, name);
    if (s.frequencyHz !== first.frequencyHz) assertSameFrequencies(first.frequencyHz, s.frequencyHz, 'reference 1', name);
  });
  const n = first.frequencyHz.length;
  const width = 2 * n;
  const canonical = new Float64Array(references.length * width);
  references.forEach(({ re, im }, r) => {
    canonical.set(re, r * width);
    canonical.set(im, r * width + n);
  });
  // v·0 is 0 for every finite v and NaN otherwise: one pass, and a search for the culprit only if needed.
  let probe = 0;
  for (let i = 0; i < canonical.length; i++) probe += canonical[i] * 0;
  if (probe !== 0) {
    const at = canonical.findIndex((v) => !Number.isFinite(v));
    const r = Math.floor(at / width);
    const t = at - r * width;
    throw new RangeError(`reference ${r + 1}: ${t < n ? 're' : 'im'}[${t < n ? t : t - n}] is ${canonical[at]}; every value must be a finite number`);
  }
  const order = rankTermsBySpread(canonical, references.length, width);
  // Re-store each spectrum in that order, in place, one row at a time.
  const row = new Float64Array(width);
  for (let r = 0; r < references.length; r++) {
    const base = r * width;
    for (let t = 0; t < width; t++) row[t] = canonical[base + order[t]];
    canonical.set(row, base);
  }
  const { pivots, distances } = choosePivots(canonical, references.length, width);
  return new PackedSpectrumIndex(Float64Array.from(first.frequencyHz), references.length, canonical, order, pivots, distances);
}
