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

/** Sentinel terms per spectrum, and terms summed between two checks against the current k-th best. */
const BLOCK = 8;
/**
 * The sentinel sum is taken in another order than the distance itself, so the two differ by
 * rounding (≤ 2N·ε relative); the bound it is compared with gets this margin.
 */
const ROUNDING_MARGIN = 1e-12;

/**
 * The library as two contiguous Float64Arrays: every spectrum's real then imaginary parts back to
 * back (`body`, 2N values each, the canonical order of `spectrumDistance`), and, streamed first,
 * a copy of a few sentinel terms per spectrum (`head`): the terms that separate library spectra
 * most, whose partial sum is a lower bound that rules out most spectra without touching their body.
 */
class PackedSpectrumIndex implements SpectrumIndex {
  private readonly width: number;
  private readonly half: number;
  private readonly headWidth: number;

  constructor(
    readonly frequencyHz: Float64Array,
    readonly size: number,
    private readonly body: Float64Array,
    private readonly head: Float64Array,
    private readonly sentinels: Int32Array,
  ) {
    this.half = frequencyHz.length;
    this.width = 2 * this.half;
    this.headWidth = sentinels.length;
  }

  get byteLength(): number {
    return this.body.byteLength + this.head.byteLength + this.sentinels.byteLength + this.frequencyHz.byteLength;
  }

  nearest(sample: Spectrum, k: number): Neighbour[] {
    if (!Number.isInteger(k) || k < 1) throw new RangeError(`nearest: k must be a whole number of at least 1, got ${k}`);
    assertWellFormed(sample, 'the sample');
    assertSameFrequencies(this.frequencyHz, sample.frequencyHz, 'the reference library', 'the sample');
    assertFiniteValues(sample.re, 're', 'the sample');
    assertFiniteValues(sample.im, 'im', 'the sample');
    const { width, half, body, head, headWidth, sentinels, size } = this;
    const wanted = Math.min(k, size);
    const query = new Float64Array(width);
    query.set(sample.re, 0);
    query.set(sample.im, half);
    const sentinelQuery = Float64Array.from(sentinels, (t) => query[t]);
    const bestIndex = new Int32Array(wanted);
    const bestSum = new Float64Array(wanted);
    let found = 0;
    let limit = Infinity;
    for (let r = 0; r < size; r++) {
      let bound = 0;
      const headBase = r * headWidth;
      for (let j = 0; j < headWidth; j++) {
        const x = sentinelQuery[j];
        const y = head[headBase + j];
        // Both zero only when the difference is zero too, so dividing by 1 then adds the 0 SciPy's convention asks for.
        bound += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
      }
      if (bound > limit * (1 + ROUNDING_MARGIN)) continue;
      // The distance itself, summed as spectrumDistance sums it (real parts, then imaginary), abandoned
      // as soon as the partial sum passes the k-th best: partial sums of non-negative terms only grow.
      const base = r * width;
      let re = 0;
      let im = 0;
      for (let start = 0; start < width && re + im <= limit; start += BLOCK) {
        const end = start + BLOCK < width ? start + BLOCK : width;
        for (let j = start; j < end; j++) {
          const x = query[j];
          const y = body[base + j];
          const term = Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
          if (j < half) re += term;
          else im += term;
        }
      }
      const exact = re + im;
      if (exact > limit || (found === wanted && exact >= bestSum[wanted - 1])) continue;
      let slot = found < wanted ? found++ : wanted - 1;
      while (slot > 0 && bestSum[slot - 1] > exact) {
        bestSum[slot] = bestSum[slot - 1];
        bestIndex[slot] = bestIndex[slot - 1];
        slot--;
      }
      bestSum[slot] = exact;
      bestIndex[slot] = r;
      if (found === wanted) limit = bestSum[wanted - 1];
    }
    return Array.from({ length: found }, (_, i) => ({ index: bestIndex[i], distance: bestSum[i] / width }));
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
  const body = new Float64Array(references.length * width);
  references.forEach(({ re, im }, r) => {
    body.set(re, r * width);
    body.set(im, r * width + n);
  });
  // v·0 is 0 for every finite v and NaN otherwise: one pass, and a search for the culprit only if needed.
  let probe = 0;
  for (let i = 0; i < body.length; i++) probe += body[i] * 0;
  if (probe !== 0) {
    const at = body.findIndex((v) => !Number.isFinite(v));
    const r = Math.floor(at / width);
    const t = at - r * width;
    throw new RangeError(`reference ${r + 1}: ${t < n ? 're' : 'im'}[${t < n ? t : t - n}] is ${body[at]}; every value must be a finite number`);
  }
  const sentinels = rankTermsBySpread(body, references.length, width).slice(0, Math.min(BLOCK, width));
  const head = new Float64Array(references.length * sentinels.length);
  for (let r = 0, h = 0; r < references.length; r++) {
    for (let j = 0; j < sentinels.length; j++, h++) head[h] = body[r * width + sentinels[j]];
  }
  return new PackedSpectrumIndex(Float64Array.from(first.frequencyHz), references.length, body, head, sentinels);
}
