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

/** Terms summed between two checks against the current k-th best. */
const BLOCK = 8;
/**
 * Pruning compares a partial sum taken in the index's term order with a distance summed in the
 * canonical order; the two differ by rounding (≤ 2N·ε relative), so the bound gets this margin.
 */
const ROUNDING_MARGIN = 1e-12;

class PackedSpectrumIndex implements SpectrumIndex {
  readonly size: number;
  private readonly width: number;
  private readonly half: number;

  constructor(
    readonly frequencyHz: Float64Array,
    private readonly packed: Float64Array,
    private readonly order: Int32Array,
    private readonly position: Int32Array,
    count: number,
  ) {
    this.size = count;
    this.width = order.length;
    this.half = this.width / 2;
  }

  get byteLength(): number {
    return this.packed.byteLength + this.order.byteLength + this.position.byteLength + this.frequencyHz.byteLength;
  }

  nearest(sample: Spectrum, k: number): Neighbour[] {
    if (!Number.isInteger(k) || k < 1) throw new RangeError(`nearest: k must be a whole number of at least 1, got ${k}`);
    assertWellFormed(sample, 'sample');
    assertSameFrequencies(this.frequencyHz, sample.frequencyHz, 'reference library', 'sample');
    assertFiniteValues(sample.re, 're', 'sample');
    assertFiniteValues(sample.im, 'im', 'sample');
    const { width, packed, order, size } = this;
    const wanted = Math.min(k, size);
    const query = new Float64Array(width);
    for (let j = 0; j < width; j++) {
      const t = order[j];
      query[j] = t < this.half ? sample.re[t] : sample.im[t - this.half];
    }
    const bestIndex = new Int32Array(wanted);
    const bestSum = new Float64Array(wanted);
    let found = 0;
    let limit = Infinity;
    for (let r = 0, base = 0; r < size; r++, base += width) {
      let sum = 0;
      for (let start = 0; start < width && sum <= limit; start += BLOCK) {
        const end = start + BLOCK < width ? start + BLOCK : width;
        for (let j = start; j < end; j++) {
          const x = query[j];
          const y = packed[base + j];
          // Both zero only when the difference is zero too, so dividing by 1 then adds the 0 SciPy's convention asks for.
          sum += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
        }
      }
      if (sum > limit) continue;
      const exact = this.canonicalSum(query, base);
      if (found === wanted && exact >= bestSum[wanted - 1]) continue;
      let slot = found < wanted ? found++ : wanted - 1;
      while (slot > 0 && bestSum[slot - 1] > exact) {
        bestSum[slot] = bestSum[slot - 1];
        bestIndex[slot] = bestIndex[slot - 1];
        slot--;
      }
      bestSum[slot] = exact;
      bestIndex[slot] = r;
      if (found === wanted) limit = bestSum[wanted - 1] * (1 + ROUNDING_MARGIN);
    }
    const terms = width;
    return Array.from({ length: found }, (_, i) => ({ index: bestIndex[i], distance: bestSum[i] / terms }));
  }

  /** The sum in `spectrumDistance`'s own order (real parts, then imaginary), so distances match it to the last bit. */
  private canonicalSum(query: Float64Array, base: number): number {
    const { position, packed, half } = this;
    let re = 0;
    for (let t = 0; t < half; t++) {
      const x = query[position[t]];
      const y = packed[base + position[t]];
      const den = Math.abs(x) + Math.abs(y);
      if (den > 0) re += Math.abs(x - y) / den;
    }
    let im = 0;
    for (let t = half; t < 2 * half; t++) {
      const x = query[position[t]];
      const y = packed[base + position[t]];
      const den = Math.abs(x) + Math.abs(y);
      if (den > 0) im += Math.abs(x - y) / den;
    }
    return re + im;
  }
}

/**
 * Packs a reference library (spectra on one grid, impedances in Ω) into one contiguous
 * Float64Array for fast top-k search by `spectrumDistance`. The library is copied, so later
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
  const order = rankTermsBySpread(references);
  const position = new Int32Array(width);
  order.forEach((t, j) => (position[t] = j));
  const packed = new Float64Array(references.length * width);
  for (let r = 0, base = 0; r < references.length; r++, base += width) {
    const { re, im } = references[r];
    for (let j = 0; j < width; j++) {
      const t = order[j];
      const value = t < n ? re[t] : im[t - n];
      if (!Number.isFinite(value)) {
        throw new RangeError(`reference ${r + 1}: ${t < n ? 're' : 'im'}[${t < n ? t : t - n}] is ${value}; every value must be a finite number`);
      }
      packed[base + j] = value;
    }
  }
  return new PackedSpectrumIndex(Float64Array.from(first.frequencyHz), packed, order, position, references.length);
}
