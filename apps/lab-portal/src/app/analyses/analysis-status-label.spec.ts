import { ANALYSIS_STATUSES } from '@ohmprint/contracts';
import { analysisStatusLabel } from './analysis-status-label';

describe('analysisStatusLabel', () => {
  it('says every status in words, each differently', () => {
    const labels = ANALYSIS_STATUSES.map(analysisStatusLabel);
    expect(labels.every((l) => /^[a-z ,]+$/.test(l) && !ANALYSIS_STATUSES.includes(l as never))).toBe(true);
    expect(new Set(labels).size).toBe(ANALYSIS_STATUSES.length);
    expect(analysisStatusLabel('submitted')).toBe('awaiting review');
  });
});
