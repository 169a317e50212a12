import { rankLots } from './compute-analysis';

/** The order the ranking must keep: nearest first, ties by lot order (the comparison sort it replaces). */
const byComparison = (d: ArrayLike<number>) => Uint32Array.from({ length: d.length }, (_, i) => i).sort((a, b) => d[a] - d[b] || a - b);

describe('ranking every lot by distance', () => {
  it('orders nearest first with ties by lot order, as a comparison sort does', () => {
    let seed = 7;
    const next = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const d = Float64Array.from({ length: 5000 }, () => next() * 0.2);
    for (let i = 0; i < d.length; i += 4) d[i] = d[(i * 31) % d.length]; // many exact ties
    d[10] = 0;
    d[11] = 0;
    d[12] = Number.MIN_VALUE;
    expect(Array.from(rankLots(d))).toEqual(Array.from(byComparison(d)));
    expect(Array.from(rankLots(Array.from(d)))).toEqual(Array.from(byComparison(d)));
  });

  it('handles distances that share their high bits, a single lot and none', () => {
    const d = Float64Array.from([0.5, 0.5000000000000001, 0.5, 0.49999999999999994]);
    expect(Array.from(rankLots(d))).toEqual([3, 0, 2, 1]);
    expect(Array.from(rankLots([0.3]))).toEqual([0]);
    expect(Array.from(rankLots([]))).toEqual([]);
  });

  it('orders thousands of distances that differ only in their low 32 bits, listed farthest first, with ties', () => {
    const bits = new DataView(new ArrayBuffer(8));
    const near = (k: number) => {
      bits.setFloat64(0, 0.05, true);
      bits.setUint32(0, bits.getUint32(0, true) + k, true);
      return bits.getFloat64(0, true);
    };
    const d = Float64Array.from({ length: 3000 }, (_, i) => near(3000 - i - (i % 7 === 0 ? 1 : 0)));
    d[100] = 0.07;
    d[200] = 0.03;
    expect(Array.from(rankLots(d))).toEqual(Array.from(byComparison(d)));
  });

  it('falls back to the comparison sort for a NaN or negative distance', () => {
    const d = [0.2, -0.1, 0.2, 0.05];
    expect(Array.from(rankLots(d))).toEqual([1, 3, 0, 2]);
  });
});
