import { distanceHistogram } from '../../../apps/api/src/modules/analyses/distance-histogram';
import { computeReferenceBand } from '../../../apps/api/src/modules/libraries/reference-band-points';
import fixture from '../fixtures/results/results.json';

// Reference values: fixtures/results/generate.py (numpy.histogram; numpy.min/max, numpy.abs, numpy.angle).
describe('histogram bins of the calibration distances against numpy.histogram', () => {
  it.each(fixture.histograms.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const h = distanceHistogram(c.distances, c.sample);
    expect(h.counts).toEqual(c.counts); // numpy.histogram(distances, bins, range=(0, top))[0]
    expect(h.binEdges).toHaveLength(c.binEdges.length);
    h.binEdges.forEach((e, i) => expect(e).toBeCloseTo(c.binEdges[i], 14)); // numpy.histogram(...)[1]
    expect(h.sampleBin).toBe(c.sampleBin); // numpy.histogram([sample], edges): the bin holding the lone value
  });
});

describe('reference band against numpy per-frequency extremes', () => {
  const keys = ['reLow', 'reHigh', 'imLow', 'imHigh', 'modulusLow', 'modulusHigh', 'phaseLowDeg', 'phaseHighDeg'] as const;
  it.each(fixture.bands.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const band = computeReferenceBand(c.lots, c.frequencyHz);
    expect(band.lotCount).toBe(c.lots.length);
    expect(band.frequencyHz).toEqual(c.frequencyHz);
    for (const k of keys) {
      // numpy.min / numpy.max over lots (axis 0) of Z', Z'', numpy.abs(Z), numpy.degrees(numpy.angle(Z))
      band[k].forEach((v, i) => expect(v).toBeCloseTo(c[k][i], 12));
    }
  });
});
