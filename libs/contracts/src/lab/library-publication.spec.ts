import { publicationProgressText } from './library-publication';

describe('what the library screen says while a version is published', () => {
  const running = (stage: 'comparing-lots' | 'estimating-thresholds' | 'storing', lotsDone: number) => ({
    state: 'running' as const,
    lotCount: 50_000,
    progress: { stage, lotsDone, lotCount: 50_000, updatedAt: '2026-12-02T20:00:00.000Z' },
  });

  it('counts the lots compared with a filling bar while the comparison runs', () => {
    expect(publicationProgressText(running('comparing-lots', 12_345))).toEqual({ headline: 'Comparing lots: 12,345 of 50,000 (24 %)…', percent: 24 });
    expect(publicationProgressText(running('comparing-lots', 0)).percent).toBe(0);
  });

  it('says what it waits for when there is nothing to count', () => {
    expect(publicationProgressText({ state: 'queued', lotCount: 50_000 })).toEqual({ headline: 'Waiting to publish…', percent: null });
    expect(publicationProgressText({ state: 'running', lotCount: 50_000 })).toEqual({ headline: 'Calibrating 50,000 lots…', percent: null });
    expect(publicationProgressText(running('estimating-thresholds', 50_000))).toEqual({ headline: 'All 50,000 lots compared; setting the thresholds…', percent: null });
    expect(publicationProgressText(running('storing', 50_000)).headline).toMatch(/^Thresholds set; storing/);
  });
});
