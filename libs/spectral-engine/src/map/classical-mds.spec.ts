import { classicalMds } from './classical-mds';

/** Euclidean distances between points, plus optional distortion to make them non-Euclidean. */
function distances(points: number[][], distort = 0): number[][] {
  return points.map((a, i) =>
    points.map((b, j) => (i === j ? 0 : Math.hypot(...a.map((x, k) => x - b[k])) * (1 + distort * Math.sin(i + j)))),
  );
}

function pseudoRandomPoints(n: number, dims: number): number[][] {
  let state = 7;
  const next = () => ((state = (Math.imul(state, 48271) >>> 0) % 2147483647) / 2147483647) - 0.5;
  return Array.from({ length: n }, () => Array.from({ length: dims }, (_, k) => next() * (5 - k)));
}

describe('classicalMds', () => {
  it('recovers planar points exactly up to rotation: all distances kept', () => {
    const points = pseudoRandomPoints(12, 2);
    const result = classicalMds(distances(points), 2);
    const back = distances(result.coordinates);
    distances(points).forEach((row, i) => row.forEach((d, j) => expect(back[i][j]).toBeCloseTo(d, 10)));
    expect(result.goodnessOfFit?.absolute).toBeCloseTo(1, 10);
  });

  it('reports negative eigenvalues of non-Euclidean distances', () => {
    const result = classicalMds(distances(pseudoRandomPoints(15, 3), 0.2), 2);
    expect(result.negativeEigenvalues?.count).toBeGreaterThan(0);
    expect(result.smallestEigenvalue).toBeLessThan(0);
    expect(result.goodnessOfFit?.absolute).toBeLessThan(result.goodnessOfFit?.positive as number);
  });

  it('gives the same leading axes from the iterative solver as from the full decomposition', () => {
    const d = distances(pseudoRandomPoints(160, 4), 0.05);
    const full = classicalMds(d, 2, { method: 'full' });
    const fast = classicalMds(d, 2);
    expect(fast.method).toBe('iterative');
    expect(fast.goodnessOfFit).toBeNull();
    fast.eigenvalues.forEach((lambda, k) => expect(lambda).toBeCloseTo(full.eigenvalues[k], 8));
    fast.coordinates.forEach((row, i) => row.forEach((x, k) => expect(x).toBeCloseTo(full.coordinates[i][k], 6)));
    expect(fast.smallestEigenvalue).toBeGreaterThanOrEqual(full.smallestEigenvalue - 1e-9);
  });

  it('gives a flat axis, not a made-up one, when the points lie on a line', () => {
    const result = classicalMds(distances([[0], [1], [3], [7]]), 2);
    expect(result.positiveAxes).toBe(1);
    expect(result.coordinates.map((row) => row[1])).toEqual([0, 0, 0, 0]);
  });

  it('rejects a matrix that is not a distance matrix, naming the entry', () => {
    expect(() => classicalMds([[0, 1], [2, 0]], 1)).toThrow('entries (1, 2) = 1 and (2, 1) = 2 differ');
    expect(() => classicalMds([[0, -1], [-1, 0]], 1)).toThrow('entry (1, 2) is -1');
    expect(() => classicalMds([[1, 1], [1, 0]], 1)).toThrow('diagonal entry (1, 1) is 1');
    expect(() => classicalMds([[0, 1], [1]], 1)).toThrow('row 2 has 1 entries');
    expect(() => classicalMds([[0, 1], [1, 0]], 2)).toThrow('dims must be a whole number from 1 to n − 1 = 1');
  });
});
