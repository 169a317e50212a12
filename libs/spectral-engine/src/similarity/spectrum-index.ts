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

/**
 * The library in term order, split in two contiguous Float64Arrays: the first block of every
 * spectrum (its sentinel terms, all most spectra ever need) back to back so a search streams
 * through them, and the remaining terms, read only for spectra that survive the first block.
 */
class PackedSpectrumIndex implements SpectrumIndex {
  private readonly width: number;
  private readonly half: number;
  private readonly headWidth: number;
  private readonly tailWidth: number;

  constructor(
    readonly frequencyHz: Float64Array,
    readonly size: number,
    private readonly head: Float64Array,
    private readonly tail: Float64Array,
    private readonly order: Int32Array,
    private readonly position: Int32Array,
  ) {
    this.width = order.length;
    this.half = this.width / 2;
    this.headWidth = Math.min(BLOCK, this.width);
    this.tailWidth = this.width - this.headWidth;
  }

  get byteLength(): number {
    return this.head.byteLength + this.tail.byteLength + this.order.byteLength + this.position.byteLength + this.frequencyHz.byteLength;
  }

  nearest(sample: Spectrum, k: number): Neighbour[] {
    if (!Number.isInteger(k) || k < 1) throw new RangeError(`nearest: k must be a whole number of at least 1, got ${k}`);
    assertWellFormed(sample, 'the sample');
    assertSameFrequencies(this.frequencyHz, sample.frequencyHz, 'the reference library', 'the sample');
    assertFiniteValues(sample.re, 're', 'sample');
    assertFiniteValues(sample.im, 'im', 'sample');
    const { width, head, tail, headWidth, tailWidth, order, size } = this;
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
    for (let r = 0; r < size; r++) {
      let sum = 0;
      const headBase = r * headWidth;
      for (let j = 0; j < headWidth; j++) {
        const x = query[j];
        const y = head[headBase + j];
        // Both zero only when the difference is zero too, so dividing by 1 then adds the 0 SciPy's convention asks for.
        sum += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
      }
      if (sum > limit) continue;
      const tailBase = r * tailWidth - headWidth;
      for (let start = headWidth; start < width && sum <= limit; start += BLOCK) {
        const end = start + BLOCK < width ? start + BLOCK : width;
        for (let j = start; j < end; j++) {
          const x = query[j];
          const y = tail[tailBase + j];
          sum += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
        }
      }
      if (sum > limit) continue;
      const exact = this.canonicalSum(query, r);
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
    return Array.from({ length: found }, (_, i) => ({ index: bestIndex[i], distance: bestSum[i] / width }));
  }

  /** The sum in `spectrumDistance`'s own order (real parts, then imaginary), so distances match it to the last bit. */
  private canonicalSum(query: Float64Array, r: number): number {
    const { position, half, head, tail, headWidth, tailWidth } = this;
    const term = (t: number) => {
      const j = position[t];
      const x = query[j];
      const y = j < headWidth ? head[r * headWidth + j] : tail[r * tailWidth + j - headWidth];
      const den = Math.abs(x) + Math.abs(y);
      return den > 0 ? Math.abs(x - y) / den : 0;
    };
    let re = 0;
    for (let t = 0; t < half; t++) re += term(t);
    let im = 0;
    for (let t = half; t < 2 * half; t++) im += term(t);
    return re + im;
  }
}

function firstNonFinite(values: Float64Array): number {
  return values.findIndex((v) => !Number.isFinite(v));
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
  const headWidth = Math.min(BLOCK, width);
  const tailWidth = width - headWidth;
  const order = rankTermsBySpread(references);
  const position = new Int32Array(width);
  order.forEach((t, j) => (position[t] = j));
  const head = new Float64Array(references.length * headWidth);
  const tail = new Float64Array(references.length * tailWidth);
  // Where term t (re 0…N−1, im N…2N−1) of every spectrum goes: the head block or the tail, at which offset.
  const inHead = Uint8Array.from(position, (p) => (p < headWidth ? 1 : 0));
  const offset = Int32Array.from(position, (p) => (p < headWidth ? p : p - headWidth));
  for (let r = 0, headBase = 0, tailBase = 0; r < references.length; r++, headBase += headWidth, tailBase += tailWidth) {
    const { re, im } = references[r];
    // v·0 is 0 for every finite v and NaN otherwise: one test per spectrum instead of one per value.
    let probe = 0;
    for (let t = 0; t < n; t++) {
      const v = re[t];
      probe += v * 0;
      if (inHead[t]) head[headBase + offset[t]] = v;
      else tail[tailBase + offset[t]] = v;
    }
    for (let t = 0; t < n; t++) {
      const v = im[t];
      probe += v * 0;
      if (inHead[n + t]) head[headBase + offset[n + t]] = v;
      else tail[tailBase + offset[n + t]] = v;
    }
    if (probe !== 0) {
      const bad = firstNonFinite(re) >= 0 ? { part: 're', at: firstNonFinite(re), values: re } : { part: 'im', at: firstNonFinite(im), values: im };
      throw new RangeError(`reference ${r + 1}: ${bad.part}[${bad.at}] is ${bad.values[bad.at]}; every value must be a finite number`);
    }
  }
  return new PackedSpectrumIndex(Float64Array.from(first.frequencyHz), references.length, head, tail, order, position);
}
