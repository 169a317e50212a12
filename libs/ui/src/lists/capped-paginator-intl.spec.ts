import { TOTAL_CAP } from '@ohmprint/contracts';
import { CappedPaginatorIntl, paginatorLength } from './capped-paginator-intl';

describe('CappedPaginatorIntl', () => {
  const intl = new CappedPaginatorIntl();

  it('reads "of 10,000+" when the total is a lower bound', () => {
    const length = paginatorLength({ total: TOTAL_CAP, totalIsLowerBound: true });
    expect(length).toBe(TOTAL_CAP + 1);
    expect(intl.getRangeLabel(0, 20, length)).toBe('1 – 20 of 10,000+');
    expect(intl.getRangeLabel(499, 20, length)).toBe('9,981 – 10,000 of 10,000+');
  });

  it('keeps the exact label up to the cap', () => {
    expect(paginatorLength({ total: TOTAL_CAP })).toBe(TOTAL_CAP);
    expect(intl.getRangeLabel(0, 20, TOTAL_CAP)).toBe('1 – 20 of 10000');
    expect(intl.getRangeLabel(1, 20, 35)).toBe('21 – 35 of 35');
  });
});
