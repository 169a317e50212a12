import type { Spectrum } from '../spectrum';
import { sampleMap } from './sample-map';

const GRID = Float64Array.from([10, 100, 1000, 10000]);
const lot = (scale: number, tilt: number): Spectrum => ({
  frequencyHz: GRID,
  re: Float64Array.from([500, 300, 200, 150].map((v, i) => v * scale * (1 + tilt * i))),
  im: Float64Array.from([-80, -120, -60, -20].map((v) => v * scale)),
});

describe('sampleMap', () => {
  const library = [1, 1.01, 0.99, 1.02, 0.98].map((s, i) => lot(s, 0.002 * i));

  it('puts the sample last and an outlying sample far from the lots', () => {
    const map = sampleMap(library, lot(1.6, 0.05));
    expect(map.points).toHaveLength(6);
    expect(map.points[5]).toMatchObject({ kind: 'sample', index: -1 });
    expect(map.points.slice(0, 5).map((p) => p.index)).toEqual([0, 1, 2, 3, 4]);
    const centre = map.points.slice(0, 5).reduce((c, p) => ({ x: c.x + p.x / 5, y: c.y + p.y / 5 }), { x: 0, y: 0 });
    const spread = Math.max(...map.points.slice(0, 5).map((p) => Math.hypot(p.x - centre.x, p.y - centre.y)));
    const sample = map.points[5];
    expect(Math.hypot(sample.x - centre.x, sample.y - centre.y)).toBeGreaterThan(3 * spread);
    expect(map.goodnessOfFit?.absolute).toBeGreaterThan(0.5);
  });

  it('needs at least two reference lots', () => {
    expect(() => sampleMap(library.slice(0, 1), lot(1, 0))).toThrow('at least two reference lots');
  });
});
