import type { AnalysisResult } from '@ohmprint/contracts';
import { compareAnalyses } from './compare-analyses';

const lot = '0b0e0c0d-0000-4000-8000-000000000001';
const base: AnalysisResult = {
  verdict: 'consistent',
  nearest: { lotId: lot, lotCode: 'L1', distance: 0.004 },
  t95: 0.006,
  t99: 0.008,
  typicality: 0.5,
  distances: [{ lotId: lot, lotCode: 'L1', distance: 0.004 }],
  map: { sample: [0.001, -0.002], lots: [] },
  histogram: { binEdges: [0, 1], counts: [1] },
  fit: { model: 'cole-cole', parameters: [{ name: 'rInf', value: 330, standardError: 0.4, unit: 'Ω·cm' }], chiSquare: 1e-4, converged: true },
  qualityFlags: [],
  replicateIds: [],
};

describe('reproducibility comparison', () => {
  it('finds nothing to report when the numbers agree', () => {
    expect(compareAnalyses(base, structuredClone(base)).differences).toEqual([]);
  });

  it('names a changed distance and a changed verdict', () => {
    const changed = structuredClone(base);
    changed.distances[0].distance = 0.0041;
    changed.verdict = 'inconclusive';
    const { differences, maxAbsoluteDifference } = compareAnalyses(base, changed);
    expect(differences.map((d) => d.field)).toEqual(['verdict', 'distances[0]']);
    expect(maxAbsoluteDifference).toBeCloseTo(0.0001, 10);
  });
});
