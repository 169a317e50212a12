import fc from 'fast-check';
import { calibrate, createSpectrumIndex, type Spectrum, type SpectrumIndex } from '@ohmprint/spectral-engine';
import { DEMO_PRODUCTS } from '../../../../../docker-free-scripts/seed/lab-demo-catalog';
import { DEMO_PROFILES, demoLots } from '../../../../../docker-free-scripts/seed/lab-demo-spectra';
import { methodGrid } from '../measurements/prepared-replicates';
import { DEFAULT_METHOD } from '../libraries/default-method';
import { DOES_NOT_BELONG_T99_MULTIPLE, pickResemblance, RESEMBLANCE_MARGIN } from './does-not-belong';

/**
 * The demo lab's libraries, built as the seed builds them (same generator, grid and quantiles).
 * Probe samples are fresh authentic lots of a product drawn with another seed: never in any library.
 */
const grid = methodGrid(DEFAULT_METHOD);
const products = DEMO_PRODUCTS.filter((p) => p.lab === 'calder');
const libraries = products.map((p) => {
  const spectra = demoLots(DEMO_PROFILES[p.profile], grid, p.lots, p.key).map((l) => l.spectrum);
  const calibration = calibrate(spectra, { lowerQuantile: DEFAULT_METHOD.lowerQuantile, upperQuantile: DEFAULT_METHOD.upperQuantile });
  return { key: p.key, index: createSpectrumIndex(spectra), t99: calibration.upperThreshold };
});

function probe(productIndex: number, seed: number): Spectrum {
  const p = products[productIndex];
  return demoLots(DEMO_PROFILES[p.profile], grid, 1, `probe:${p.key}:${seed}`)[0].spectrum;
}

const nearest = (index: SpectrumIndex, s: Spectrum) => index.nearest(s, 1)[0].distance;

/** The flag's decision for a sample measured against `ordered`, with the lab's other libraries as candidates. */
function flagged(sample: Spectrum, ordered: number): string | null {
  const own = libraries[ordered];
  const others = libraries.filter((_, i) => i !== ordered).map((l) => ({ item: l.key, distance: nearest(l.index, sample), t99: l.t99 }));
  return pickResemblance({ distance: nearest(own.index, sample), t99: own.t99 }, others)?.item ?? null;
}

describe('the "does not belong" decision on the demo libraries', () => {
  const product = fc.integer({ min: 0, max: products.length - 1 });
  const seed = fc.integer({ min: 0, max: 1_000_000 });

  it('flags every authentic lot measured against another product’s library, naming its own product', () => {
    fc.assert(
      fc.property(product, product, seed, (actual, ordered, s) => {
        fc.pre(actual !== ordered);
        expect(flagged(probe(actual, s), ordered)).toBe(products[actual].key);
      }),
      { numRuns: 150 },
    );
  });

  it('never flags an authentic lot measured against its own product’s library', () => {
    fc.assert(
      fc.property(product, seed, (actual, s) => {
        expect(flagged(probe(actual, s), actual)).toBeNull();
      }),
      { numRuns: 100 },
    );
  });
});

describe('pickResemblance', () => {
  it.each([
    ['not far enough from its own library', { distance: DOES_NOT_BELONG_T99_MULTIPLE * 0.01, t99: 0.01 }, [{ item: 'b', distance: 0.001, t99: 0.01 }], null],
    ['another library nearer, but not by the margin', { distance: 0.06, t99: 0.01 }, [{ item: 'b', distance: 0.021, t99: 0.01 }], null],
    ['exactly the margin nearer', { distance: 0.06, t99: 0.01 }, [{ item: 'b', distance: 0.06 / RESEMBLANCE_MARGIN, t99: 0.01 }], 'b'],
    ['the least multiple of its own T99 wins, not the least raw distance', { distance: 0.4, t99: 0.01 }, [{ item: 'tight', distance: 0.02, t99: 0.004 }, { item: 'broad', distance: 0.03, t99: 0.02 }], 'broad'],
    ['a library without thresholds is no candidate', { distance: 0.4, t99: 0.01 }, [{ item: 'b', distance: 0.001, t99: null }], null],
    ['no verdict for the sample: no flag', { distance: 0.4, t99: null }, [{ item: 'b', distance: 0.001, t99: 0.01 }], null],
  ])('%s', (_name, own, candidates, expected) => {
    expect(pickResemblance(own, candidates)?.item ?? null).toBe(expected);
  });
});
