import { convexHull } from './convex-hull';

describe('convexHull', () => {
  it('finds the same hull vertices as scipy.spatial.ConvexHull', () => {
    const pts: [number, number][] = [[0, 0], [2, 0], [1, 1], [2, 2], [0, 2], [1, 3], [0.5, 0.5]];
    // SciPy 1.17.1: ConvexHull(pts).vertices → points 0, 1, 3, 4, 5 = (0,0) (2,0) (2,2) (1,3) (0,2)
    const hull = convexHull(pts);
    expect(hull).toHaveLength(5);
    expect(hull).toEqual(expect.arrayContaining([[0, 0], [2, 0], [2, 2], [1, 3], [0, 2]]));
  });

  it('winds every hull the same way so overlapping hulls shade as one region', () => {
    const signedArea = (h: [number, number][]) => h.reduce((s, [x, y], i) => s + x * h[(i + 1) % h.length][1] - h[(i + 1) % h.length][0] * y, 0);
    expect(signedArea(convexHull([[0, 0], [1, 0], [1, 1], [0, 1]]))).toBeGreaterThan(0);
    expect(signedArea(convexHull([[5, 5], [3, 9], [8, 7], [4, 4]]))).toBeGreaterThan(0);
  });
});
