import { axisShares, classicalMds } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/map/axis-shares.json';
import eurodist from '../fixtures/map/eurodist.json';

describe('map axes’ share of the spread', () => {
  // numpy 2.4.6 / scipy 1.17.1 (fixtures/map/generate_axis_shares.py): λₖ / Σ max(λ, 0) of the
  // double-centred squared Canberra distances between seeded random vectors.
  it.each(fixture.cases.map((c) => [c.n, c] as const))('matches numpy for %i points with Canberra distances', (_n, c) => {
    const mds = classicalMds(c.distances, 2, { method: 'full' });
    const shares = axisShares(mds.eigenvalues, true)!;
    expect(shares[0]).toBeCloseTo(c.shares[0], 9);
    expect(shares[1]).toBeCloseTo(c.shares[1], 9);
  });

  it('adds up over the two axes to R’s positive goodness of fit (cmdscale(eurodist)$GOF[2])', () => {
    const mds = classicalMds(eurodist.distances, 2, { method: 'full' });
    const shares = axisShares(mds.eigenvalues, true)!;
    // R 4.2.2 cmdscale(eurodist, k = 2, eig = TRUE)$GOF (fixtures/map/generate.R)
    expect(shares[0] + shares[1]).toBeCloseTo(eurodist.k2.GOF[1], 9);
  });

  it('gives no shares when only the largest eigenvalues were found', () => {
    const mds = classicalMds(eurodist.distances, 2, { method: 'iterative' });
    expect(axisShares(mds.eigenvalues, mds.method === 'full')).toBeNull();
  });
});
