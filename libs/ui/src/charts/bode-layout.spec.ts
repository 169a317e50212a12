import { bodeLayout } from './bode-layout';
import type { SpectrumSeries } from './chart-types';
import { referenceEnvelope } from './reference-envelope';
import { pathPoints } from './test-path';

const re = [100, 80, 60];
const im = [-50, -60, -40];
const sample: SpectrumSeries = { label: 'Replicate 1', frequencyHz: [10, 100, 1000], re, im };

describe('bodeLayout', () => {
  // 640 × 480: plot x from 68 to 624, the |Z| panel from y 12 to 212.
  const layout = bodeLayout([sample], null, 640, 480);

  it('places frequency on a log axis shared by both panels', () => {
    const mag = pathPoints(layout.magnitude.series[0].d);
    const phase = pathPoints(layout.phase.series[0].d);
    expect(mag.map(([x]) => x)).toEqual([68, 346, 624]);
    expect(phase.map(([x]) => x)).toEqual([68, 346, 624]);
  });

  it('plots |Z| on a log axis (axis rounded out to 10 Ω … 1 kΩ)', () => {
    // numpy 2.4.6: 212 - 200·(log10(np.abs(Z)) - 1)/2 for Z = [100−50j, 80−60j, 60−40j]
    const ys = pathPoints(layout.magnitude.series[0].d).map(([, y]) => y);
    expect(ys[0]).toBeCloseTo(107.1545, 1);
    expect(ys[1]).toBeCloseTo(112, 1);
    expect(ys[2]).toBeCloseTo(126.1998, 1);
  });

  it('plots the phase linearly in degrees', () => {
    // numpy 2.4.6: phases −26.565°, −36.870°, −33.690°; (φ1−φ0)/(φ2−φ0) = 1.4462909225961782
    const ys = pathPoints(layout.phase.series[0].d).map(([, y]) => y);
    expect((ys[1] - ys[0]) / (ys[2] - ys[0])).toBeCloseTo(1.4462909225961782, 2);
    expect(ys[0]).toBeLessThan(ys[1]);
  });

  it('labels every decade of frequency under the phase panel only', () => {
    const labelled = layout.phase.xTicks.filter((t) => t.label);
    expect(labelled.map((t) => t.label)).toEqual(['10 Hz', '100 Hz', '1 kHz']);
    expect(layout.magnitude.xTicks.every((t) => t.label === '')).toBe(true);
  });

  it('shades the reference band behind the series in both panels', () => {
    const lots = [0.95, 1, 1.05].map((k, i) => ({ ...sample, label: `Lot ${i}`, re: re.map((v) => v * k), im: im.map((v) => v * k) }));
    const band = referenceEnvelope(lots, { kind: 'range' }, 'range');
    const withBand = bodeLayout([sample], band, 640, 480);
    expect(pathPoints(withBand.magnitude.band)).toHaveLength(6);
    expect(withBand.phase.band).toMatch(/Z$/);
  });

  it('marks excluded replicates as muted and gives each series its own dash', () => {
    const second = { ...sample, label: 'Replicate 2', muted: true };
    const two = bodeLayout([sample, second], null, 640, 480);
    expect(two.magnitude.series.map((s) => s.muted)).toEqual([false, true]);
    expect(two.magnitude.series[0].style.dash).not.toBe(two.magnitude.series[1].style.dash);
  });
});
