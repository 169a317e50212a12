import { logGrid } from './log-grid';
import { GridCoverageError, resample } from './resample';

describe('logGrid', () => {
  it('spaces points evenly in log-frequency with exact ends', () => {
    const grid = logGrid(1, 1e4, 5);
    expect(Array.from(grid)).toEqual([1, 10, 100, 1000, 10000].map((f, i) => (i === 0 || i === 4 ? f : expect.closeTo(f, 9))));
  });

  it('rejects a band that is empty or a grid of one point', () => {
    expect(() => logGrid(100, 10, 5)).toThrow('highest frequency 10 Hz must be above the lowest (100 Hz)');
    expect(() => logGrid(0, 10, 5)).toThrow('lowest frequency 0 Hz must be a positive number');
    expect(() => logGrid(1, 10, 1)).toThrow('at least 2 points');
  });
});

describe('resample', () => {
  const measured = {
    frequencyHz: Float64Array.from([0.5, 5, 50, 500, 5000]),
    // Linear in log10 f, so interpolation in log-frequency must reproduce it exactly.
    re: Float64Array.from([0.5, 5, 50, 500, 5000].map((f) => 100 - 10 * Math.log10(f))),
    im: Float64Array.from([0.5, 5, 50, 500, 5000].map((f) => -5 - 2 * Math.log10(f))),
  };

  it('interpolates in log-frequency, not in frequency', () => {
    const out = resample(measured, Float64Array.from([1, 10, 1000]));
    expect(Array.from(out.re)).toEqual([100, 90, 70].map((v) => expect.closeTo(v, 12)));
    expect(Array.from(out.im)).toEqual([-5, -7, -11].map((v) => expect.closeTo(v, 12)));
    expect(Array.from(out.frequencyHz)).toEqual([1, 10, 1000]);
  });

  it('rejects a spectrum that does not cover the band and names what is missing', () => {
    const attempt = () => resample(measured, logGrid(0.1, 1e5, 13));
    expect(attempt).toThrow(GridCoverageError);
    expect(attempt).toThrow('the spectrum covers 500 mHz to 5 kHz but the grid needs 100 mHz to 500 mHz and 5 kHz to 100 kHz as well');
    try {
      attempt();
    } catch (error) {
      expect((error as GridCoverageError).missing).toEqual([
        { fromHz: 0.1, toHz: 0.5 },
        { fromHz: 5000, toHz: 1e5 },
      ]);
    }
  });

  it('accepts a grid whose ends match the measured band', () => {
    const out = resample(measured, logGrid(0.5, 5000, 9));
    expect(out.re[0]).toBeCloseTo(measured.re[0], 12);
    expect(out.re[8]).toBeCloseTo(measured.re[4], 12);
  });

  it('rejects frequencies that do not rise', () => {
    const unsorted = { ...measured, frequencyHz: Float64Array.from([0.5, 5, 5, 500, 5000]) };
    expect(() => resample(unsorted, Float64Array.from([1, 10]))).toThrow('frequency 3 (5 Hz) does not rise above frequency 2 (5 Hz)');
  });
});
