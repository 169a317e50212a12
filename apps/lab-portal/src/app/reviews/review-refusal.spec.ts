import { ApiProblem } from '@ohmprint/ui';
import { reviewRefusal } from './review-refusal';

describe('reviewRefusal', () => {
  it('explains the four-eyes refusal in plain words and keeps the server detail', () => {
    const p = new ApiProblem(403, 'Forbidden', 'You analysed OP-7K3M-Q9 yourself.');
    expect(reviewRefusal(p)).toBe('Refused: the same person may not both analyse and review (four-eyes rule). You analysed OP-7K3M-Q9 yourself.');
  });

  it('says when someone else decided first', () => {
    expect(reviewRefusal(new ApiProblem(409, 'Conflict', undefined))).toBe('This analysis is no longer waiting for review (someone else may have decided it).');
  });

  it('passes any other problem through as its summary', () => {
    expect(reviewRefusal(new ApiProblem(500, 'Server error', 'The PDF could not be signed.'))).toBe('The PDF could not be signed.');
  });
});
