import type { SpectrumSeries } from './chart-types';
import { referenceEnvelope } from './reference-envelope';

const grid = [10, 100, 1000];
const lot = (label: string, re: number[], im: number[]): SpectrumSeries => ({ label, frequencyHz: grid, re, im });
const lots = [
  lot('A', [100, 80, 60], [-50, -60, -40]),
  lot('B', [104, 78, 63], [-48, -63, -41]),
  lot('C', [98, 83, 59], [-53, -58, -39]),
  lot('D', [101, 79, 61], [-49, -61, -42]),
];

describe('referenceEnvelope', () => {
  it('gives the 10th–90th percentile band of each part as numpy.percentile does', () => {
    const band = referenceEnvelope(lots, { kind: 'percentile', lowerPercent: 10, upperPercent: 90 }, 'P10–P90');
    // numpy 2.4.6: np.percentile(re, 10, axis=0) etc.
    expect(Array.from(band.reLow)).toEqual([expect.closeTo(98.6, 10), expect.closeTo(78.3, 10), expect.closeTo(59.3, 10)]);
    expect(Array.from(band.reHigh)).toEqual([expect.closeTo(103.1, 10), expect.closeTo(82.1, 10), expect.closeTo(62.4, 10)]);
    expect(Array.from(band.imLow)).toEqual([expect.closeTo(-52.1, 10), expect.closeTo(-62.4, 10), expect.closeTo(-41.7, 10)]);
    expect(Array.from(band.imHigh)).toEqual([expect.closeTo(-48.3, 10), expect.closeTo(-58.6, 10), expect.closeTo(-39.3, 10)]);
  });

  it('takes the modulus and phase band lot by lot (numpy.abs / numpy.angle, then percentile)', () => {
    const band = referenceEnvelope(lots, { kind: 'percentile', lowerPercent: 10, upperPercent: 90 }, 'P10–P90');
    // numpy 2.4.6: np.percentile(np.abs(Z), 10, axis=0), np.percentile(np.degrees(np.angle(Z)), 90, axis=0)
    expect(band.modulusLow[0]).toBeCloseTo(111.53057024461009, 9);
    expect(band.modulusHigh[2]).toBeCloseTo(74.83477307784781, 9);
    expect(band.phaseLowDeg[1]).toBeCloseTo(-38.55135851690375, 9);
    expect(band.phaseHighDeg[0]).toBeCloseTo(-25.106680499202998, 9);
  });

  it('spans the full range of the lots for a min–max band', () => {
    const band = referenceEnvelope(lots, { kind: 'range' }, 'range');
    // numpy 2.4.6: np.abs(Z).min(axis=0), np.degrees(np.angle(Z)).max(axis=0)
    expect(band.modulusLow[2]).toBeCloseTo(70.7248188403477, 9);
    expect(band.phaseHighDeg[1]).toBeCloseTo(-34.945664400005654, 9);
    expect(Array.from(band.reHigh)).toEqual([104, 83, 63]);
  });

  it('refuses lots that are not on the same grid, naming the lot', () => {
    const off = { ...lots[1], frequencyHz: [10, 100, 2000] };
    expect(() => referenceEnvelope([lots[0], off], { kind: 'range' }, 'x')).toThrow('lot 2 ("B") is not on the shared grid at point 3');
  });
});
