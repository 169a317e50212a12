import { referenceEnvelope } from './reference-envelope';

describe('reference envelope for the report plots', () => {
  it('spans the lots’ modulus and phase at each frequency', () => {
    const grid = Float64Array.of(100, 1000);
    const lots = [
      // 1 − 1j: |Z| = √2, phase −45°; 3 + 4j: |Z| = 5, phase atan2(4, 3) = 53.130102354° (elementary trigonometry).
      { frequencyHz: grid, re: Float64Array.of(1, 3), im: Float64Array.of(-1, 4) },
      { frequencyHz: grid, re: Float64Array.of(2, 3), im: Float64Array.of(0, -4) },
    ];
    const e = referenceEnvelope(lots, grid);
    expect(e.modulusMin[0]).toBeCloseTo(Math.SQRT2, 12);
    expect(e.modulusMax[0]).toBe(2);
    expect(e.phaseMinDeg[0]).toBeCloseTo(-45, 12);
    expect(e.phaseMaxDeg[0]).toBe(0);
    expect(e.modulusMin[1]).toBe(5);
    expect(e.phaseMaxDeg[1]).toBeCloseTo(53.130102354, 8);
    expect(e.phaseMinDeg[1]).toBeCloseTo(-53.130102354, 8);
  });

  it('spans the lots’ real and imaginary parts for the Nyquist band', () => {
    const grid = Float64Array.of(100, 1000);
    const lots = [
      { frequencyHz: grid, re: Float64Array.of(1, 3), im: Float64Array.of(-1, 4) },
      { frequencyHz: grid, re: Float64Array.of(2, 3), im: Float64Array.of(0, -4) },
    ];
    const e = referenceEnvelope(lots, grid);
    expect([e.reMin, e.reMax, e.imMin, e.imMax]).toEqual([[1, 3], [2, 3], [-1, -4], [0, 4]]);
  });
});
