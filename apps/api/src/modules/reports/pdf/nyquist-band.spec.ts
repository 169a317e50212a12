import { convexHull, nyquistBandPolygons } from './nyquist-band';

describe('the Nyquist reference band of the report', () => {
  it('joins neighbouring per-frequency boxes by their convex hull, as the web chart does', () => {
    const band = nyquistBandPolygons({
      frequencyHz: [10, 100],
      modulusMin: [0, 0], modulusMax: [0, 0], phaseMinDeg: [0, 0], phaseMaxDeg: [0, 0],
      reMin: [0, 2], reMax: [1, 3], imMin: [-1, -3], imMax: [0, -2],
    });
    expect(band).toHaveLength(1);
    // boxes [0,1]×[0,1] and [2,3]×[2,3] in (Z′, −Z″): hull is the hexagon of their outer corners
    // (worked by hand: the corners (1,0)…(3,2) and (0,1)…(2,3) are the only ones off the diagonal)
    expect(new Set(band[0].map((p) => p.join(',')))).toEqual(new Set(['0,0', '1,0', '3,2', '3,3', '2,3', '0,1']));
  });

  it('falls back to the polar sector of |Z| and phase for reports issued before Z′/Z″ were stored', () => {
    const [hull] = nyquistBandPolygons({ frequencyHz: [10], modulusMin: [1], modulusMax: [2], phaseMinDeg: [-90], phaseMaxDeg: [0] });
    // |Z| 1–2, phase −90°…0°: corners (1,0), (2,0), (0,1), (0,2) in (Z′, −Z″); cos(−90°) is 6e-17 in doubles
    const rounded = hull.map(([x, y]) => [Math.round(x * 1e9) / 1e9, Math.round(y * 1e9) / 1e9].join(','));
    expect(new Set(rounded)).toEqual(new Set(['1,0', '2,0', '0,2', '0,1']));
  });

  it('drops points inside the hull', () => {
    expect(convexHull([[0, 0], [2, 0], [1, 1], [2, 2], [0, 2], [1, 0]])).toHaveLength(4);
  });
});
