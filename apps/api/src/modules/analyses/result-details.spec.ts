import request from 'supertest';
import { fitModel, impedance } from '@ohmprint/spectral-engine';
import type { Analysis } from '@ohmprint/contracts';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { analyseDemoSample, useTestApp } from '../../testing';
import { claimedLotMatch } from './analysis-views';

jest.setTimeout(90_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

async function analysisOf(code: string): Promise<Analysis> {
  const id = await analyseDemoSample(t, code);
  const res = await request(t.app).get(`/api/lab/analyses/${id}`).set(await t.authFor('analyst'));
  expect(res.status).toBe(200);
  return res.body;
}

describe('what the result screens draw beside the verdict', () => {
  let a: Analysis;
  beforeAll(async () => {
    // OP-7K3M-Q9: an authentic Ridgeline Red bought in a shop, claimed to be the producer's lot L24-118.
    a = await analysisOf('OP-7K3M-Q9');
  });

  it('returns the fitted curve at the measured frequencies and the weighting χ² used', () => {
    const fit = a.result.fit!;
    expect(fit.weighting).toBe('modulus');
    expect(fit.curve!.re).toHaveLength(a.sampleSpectrum.frequencyHz.length);
    expect(fit.curve!.im).toHaveLength(a.sampleSpectrum.frequencyHz.length);
    // The curve is the model at the fitted values…
    const params = Object.fromEntries(fit.parameters.map((p) => [p.name, p.value]));
    const model = impedance(fit.model, params, Float64Array.from(a.sampleSpectrum.frequencyHz));
    fit.curve!.re.forEach((v, i) => expect(v).toBeCloseTo(model.re[i], 9));
    // …and its residuals against the data are the engine's own fit residuals.
    const spectrum = { frequencyHz: Float64Array.from(a.sampleSpectrum.frequencyHz), re: Float64Array.from(a.sampleSpectrum.re), im: Float64Array.from(a.sampleSpectrum.im) };
    const engine = fitModel(spectrum, fit.model, { restarts: 1 });
    if (!engine.converged) throw new Error('the engine fit should converge on the demo sample');
    a.sampleSpectrum.re.forEach((re, i) => {
      const modulus = Math.hypot(re, a.sampleSpectrum.im[i]);
      expect((100 * (re - fit.curve!.re[i])) / modulus).toBeCloseTo(engine.residualsRePct[i], 6);
      expect((100 * (a.sampleSpectrum.im[i] - fit.curve!.im[i])) / modulus).toBeCloseTo(engine.residualsImPct[i], 6);
    });
    // Small: one curve, not a dense resampling (the result stays light for the screens).
    expect(JSON.stringify(fit.curve).length).toBeLessThan(4 * JSON.stringify(a.sampleSpectrum.re).length);
  });

  it('gives each map axis its share of the spread, the first the larger', () => {
    const [one, two] = a.result.map.axisShares!;
    expect(one).toBeGreaterThan(0);
    expect(two).toBeGreaterThan(0);
    expect(one).toBeGreaterThanOrEqual(two);
    expect(one + two).toBeLessThanOrEqual(1 + 1e-12);
  });

  it('names the producer’s own code of the nearest lot and says whether it is the claimed lot', () => {
    const nearest = a.result.nearest!;
    const producer = a.producerLotCodes![nearest.lotId];
    expect(producer).toMatch(/^L24-1\d\d$/);
    expect(nearest.lotCode).toMatch(/^RID-L\d{4}$/);
    expect(a.claimedLot).toEqual({ lotCode: 'L24-118', nearestIsClaimed: producer === 'L24-118' });
    // Every lot on the map has its producer code too.
    for (const lot of a.result.map.lots) expect(a.producerLotCodes![lot.lotId]).toMatch(/^L24-1\d\d$/);
  });
});

describe('claimedLotMatch', () => {
  it('compares codes as typed from a label: case, spaces and dashes do not matter', () => {
    expect(claimedLotMatch('l24 118', 'L24-118')).toEqual({ lotCode: 'l24 118', nearestIsClaimed: true });
    expect(claimedLotMatch('L24-118', 'L24-131')).toEqual({ lotCode: 'L24-118', nearestIsClaimed: false });
  });

  it('says nothing when no lot was claimed, and "unknown" when the nearest lot has no producer code', () => {
    expect(claimedLotMatch('', 'L24-118')).toBeNull();
    expect(claimedLotMatch('   ', 'L24-118')).toBeNull();
    expect(claimedLotMatch(null, 'L24-118')).toBeNull();
    expect(claimedLotMatch('L24-118', null)).toEqual({ lotCode: 'L24-118', nearestIsClaimed: null });
  });

  it('does not match on punctuation alone or on a NUL byte', () => {
    expect(claimedLotMatch('--', '..')).toEqual({ lotCode: '--', nearestIsClaimed: false });
    expect(claimedLotMatch('L24-118\u0000', 'L24-118')).toEqual({ lotCode: 'L24-118\u0000', nearestIsClaimed: false });
  });
});
