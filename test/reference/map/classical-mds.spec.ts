import { classicalMds, type MdsResult } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/map/eurodist.json';

/** Compares coordinates up to the sign of each axis, which classical MDS leaves open. */
function expectSameUpToAxisSign(actual: number[][], expected: number[][], tolerance: number): void {
  const axes = expected[0].length;
  for (let k = 0; k < axes; k++) {
    const sign = Math.sign(actual[0][k]) === Math.sign(expected[0][k]) ? 1 : -1;
    expected.forEach((row, i) => expect(Math.abs(sign * actual[i][k] - row[k])).toBeLessThanOrEqual(tolerance));
  }
}

describe('classical MDS against R cmdscale(eurodist)', () => {
  const full: MdsResult = classicalMds(fixture.distances, 2, { method: 'full' });

  it('finds every eigenvalue R finds', () => {
    expect(full.eigenvalues).toHaveLength(21);
    // R 4.2.2 cmdscale(eurodist, eig = TRUE)$eig (fixtures/map/generate.R); 19538377.08954, 11856555.33400, 1528844.46799 in the reference notes.
    fixture.eigenvalues.forEach((lambda, i) => expect(Math.abs(full.eigenvalues[i] - lambda)).toBeLessThanOrEqual(1e-6 * fixture.eigenvalues[0]));
  });

  it('reports the negative eigenvalues rather than hiding them', () => {
    // R lists 10 negative eigenvalues; one of them (−3.7e−9) is the rounding-level zero of the centring direction.
    expect(full.negativeEigenvalues?.count).toBe(9);
    const expectedNegative = fixture.eigenvalues.filter((x) => x < -1).reduce((s, x) => s - x, 0);
    expect(full.negativeEigenvalues?.sumOfMagnitudes).toBeCloseTo(expectedNegative, 0); // R cmdscale eig
    expect(full.smallestEigenvalue).toBeCloseTo(fixture.eigenvalues[20], 0); // R cmdscale eig
  });

  it('gives R’s goodness of fit', () => {
    expect(full.goodnessOfFit?.absolute).toBeCloseTo(0.753754315508, 11); // R cmdscale(eurodist, k=2)$GOF[1]
    expect(full.goodnessOfFit?.positive).toBeCloseTo(0.867913429648, 11); // R cmdscale(eurodist, k=2)$GOF[2]
    const three = classicalMds(fixture.distances, 3, { method: 'full' });
    expect(three.goodnessOfFit?.absolute).toBeCloseTo(fixture.k3.GOF[0], 11); // R cmdscale(eurodist, k=3)$GOF
    expect(three.goodnessOfFit?.positive).toBeCloseTo(fixture.k3.GOF[1], 11); // R cmdscale(eurodist, k=3)$GOF
  });

  it('places the cities where R does, up to the sign of each axis', () => {
    // Athens (2290.2746796315, 1798.802928085) etc.: R cmdscale(eurodist, k=2)$points.
    expectSameUpToAxisSign(full.coordinates, fixture.k2.points, 1e-6);
    const three = classicalMds(fixture.distances, 3, { method: 'full' });
    expectSameUpToAxisSign(three.coordinates, fixture.k3.points, 1e-6); // R cmdscale(eurodist, k=3)$points
  });

  it('gets the same leading axes with the iterative solver', () => {
    const iterative = classicalMds(fixture.distances, 3, { method: 'iterative' });
    expect(iterative.eigenvalues).toHaveLength(3);
    iterative.eigenvalues.forEach((lambda, i) => expect(Math.abs(lambda - fixture.eigenvalues[i])).toBeLessThanOrEqual(1e-6 * fixture.eigenvalues[0])); // R cmdscale eig
    expectSameUpToAxisSign(iterative.coordinates, fixture.k3.points, 1e-5); // R cmdscale(eurodist, k=3)$points
    expect(iterative.smallestEigenvalue).toBeLessThan(0); // R: eurodist is not Euclidean (negative eigenvalues)
  });
});

describe('classical MDS of an exact case', () => {
  it('recovers the corners of a 3 × 4 rectangle', () => {
    const corners = [
      [-2, -1.5],
      [2, -1.5],
      [2, 1.5],
      [-2, 1.5],
    ];
    const d = corners.map((a) => corners.map((b) => Math.hypot(a[0] - b[0], a[1] - b[1])));
    const result = classicalMds(d, 2, { method: 'full' });
    // Exact by hand: B = X·Xᵀ for the centred corners, eigenvalues 4·2² = 16, 4·1.5² = 9, 0, 0.
    [16, 9, 0, 0].forEach((lambda, i) => expect(result.eigenvalues[i]).toBeCloseTo(lambda, 12));
    expectSameUpToAxisSign(result.coordinates, corners, 1e-12);
    expect(result.goodnessOfFit?.absolute).toBeCloseTo(1, 12);
    expect(result.negativeEigenvalues?.count).toBe(0);
  });
});
