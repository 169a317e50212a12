import type { SpectrumSeries } from './chart-types';
import { nyquistLayout } from './nyquist-layout';
import { referenceEnvelope } from './reference-envelope';
import { pathPoints } from './test-path';

/** Parallel RC: Z = R / (1 + jωRC), a semicircle of diameter R centred at (R/2, 0) (textbook result). */
function parallelRc(r: number, c: number, label = 'RC'): SpectrumSeries {
  const f = Array.from({ length: 41 }, (_, i) => 10 ** (-1 + i * 0.15));
  const re: number[] = [];
  const im: number[] = [];
  for (const hz of f) {
    const wrc = 2 * Math.PI * hz * r * c;
    re.push(r / (1 + wrc * wrc));
    im.push((-r * wrc) / (1 + wrc * wrc));
  }
  return { label, frequencyHz: f, re, im };
}

describe('nyquistLayout', () => {
  const rc = parallelRc(1000, 1e-5);
  const layout = nyquistLayout([rc], null, 640, 400);

  it('draws the RC semicircle as a circle, not an ellipse (equal axes)', () => {
    const pts = pathPoints(layout.series[0].d);
    // Locate the centre (R/2, 0) from the first point and the scale's unit length, then every
    // other point must sit R/2 from it in SVG units too.
    const upp = layout.unitsPerPixel;
    const centre = [pts[0][0] + (500 - rc.re[0]) / upp, pts[0][1] - rc.im[0] / upp];
    const radius = 500 / upp;
    for (const [x, y] of pts) {
      expect(Math.hypot(x - centre[0], y - centre[1])).toBeCloseTo(radius, 0);
    }
  });

  it('draws −Z″ upwards: the arc rises above the real axis', () => {
    const pts = pathPoints(layout.series[0].d);
    const mid = pts[Math.floor(pts.length / 2)];
    expect(mid[1]).toBeLessThan(pts[0][1]);
  });

  it('marks whole decades of frequency along the arc', () => {
    // τ = RC = 10 ms puts the apex near 16 Hz; 10 kHz and 100 kHz crowd at the origin, so only their dots stay.
    expect(layout.frequencyMarks.map((m) => m.label)).toEqual(['100 mHz', '1 Hz', '10 Hz', '100 Hz', '1 kHz', '', '']);
  });

  it('shades the swept reference region between neighbouring grid points', () => {
    const lots = [0.97, 1, 1.03].map((k, i) => parallelRc(1000 * k, 1e-5, `Lot ${i}`));
    const band = referenceEnvelope(lots, { kind: 'range' }, 'range');
    const withBand = nyquistLayout([rc], band, 640, 400);
    // One closed hull per pair of neighbouring grid points.
    expect(withBand.band.split('Z').filter(Boolean)).toHaveLength(40);
  });
});

describe('decade marks where the arc bunches up', () => {
  it('keeps every dot but drops labels that would overprint their neighbour', () => {
    // Rs + R‖C: the low decades all sit near Z′ = Rs + R, at the right end of the arc.
    const f = Array.from({ length: 61 }, (_, i) => 10 ** (-1 + i * 0.1));
    const re = f.map((hz) => 300 + 150 / (1 + (2 * Math.PI * hz * 150 * 1e-7) ** 2));
    const im = f.map((hz) => (-150 * (2 * Math.PI * hz * 150 * 1e-7)) / (1 + (2 * Math.PI * hz * 150 * 1e-7) ** 2));
    const layout = nyquistLayout([{ label: 'x', frequencyHz: f, re, im }], null, 640, 400);
    const labelled = layout.frequencyMarks.filter((m) => m.label);
    expect(layout.frequencyMarks).toHaveLength(7);
    expect(labelled.length).toBeLessThan(7);
    for (let i = 1; i < labelled.length; i++) {
      expect(Math.hypot(labelled[i].x - labelled[i - 1].x, labelled[i].y - labelled[i - 1].y)).toBeGreaterThanOrEqual(28);
    }
  });
});

describe('nyquistLayout frequency labels', () => {
  it('keeps every decade label inside the plot, even at the arc’s right end', () => {
    const f = Array.from({ length: 41 }, (_, i) => 10 ** (2 + i / 10));
    const re = f.map((x) => 380 + 160 / (1 + (x / 2e4) ** 2));
    const im = f.map((x) => (-160 * (x / 2e4)) / (1 + (x / 2e4) ** 2));
    const layout = nyquistLayout([{ label: 's', frequencyHz: f, re, im }], null, 640, 400);
    const shown = layout.frequencyMarks.filter((m) => m.label && m.box?.placed).map((m) => m.box!);
    expect(shown.length).toBeGreaterThanOrEqual(3);
    for (const b of shown) {
      expect(b.x).toBeGreaterThanOrEqual(layout.area.left);
      expect(b.x + b.width).toBeLessThanOrEqual(layout.area.left + layout.area.width + 1e-9);
      expect(b.y).toBeGreaterThanOrEqual(layout.area.top);
    }
  });
});
