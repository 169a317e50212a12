import type { ApiProblem } from '@ohmprint/ui';

/**
 * The API refuses a review by the analysis's own analyst with 403 (four-eyes rule) and a review
 * of an analysis no longer waiting with 409; say which in plain words, keeping the server's detail.
 */
export function reviewRefusal(p: ApiProblem): string {
  if (p.status === 403) {
    return `Refused: the same person may not both analyse and review (four-eyes rule). ${p.detail ?? ''}`.trim();
  }
  if (p.status === 409) {
    return `This analysis is no longer waiting for review (someone else may have decided it). ${p.detail ?? ''}`.trim();
  }
  return p.summary;
}
