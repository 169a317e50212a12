import { SEARCH_TOTAL_CAP, TOTAL_CAP } from '@ohmprint/contracts';
import { CappedPaginatorIntl, paginatorLength } from './capped-paginator-intl';

describe('CappedPaginatorIntl', () => {
  const intl = new CappedPaginatorIntl();

  it('reads "of 10,000+" when a list\'s total is a lower bound', () => {
    const length = paginatorLength({ total: TOTAL_CAP, totalIsLowerBound: true });
    expect(intl.getRangeLabel(0, 20, length)).toBe('1 – 20 of 10,000+');
    expect(intl.getRangeLabel(499, 20, length)).toBe('9,981 – 10,000 of 10,000+');
  });

  it('reads "of 1,000+" for a search counted to its cap, and offers the page after the cap', () => {
    const length = paginatorLength({ total: SEARCH_TOTAL_CAP, totalIsLowerBound: true });
    expect(intl.getRangeLabel(0, 20, length)).toBe('1 – 20 of 1,000+');
    expect(intl.getRangeLabel(50, 20, length)).toBe('1,001 – 1,020 of 1,000+');
    // the paginator's page count is ceil(length / pageSize): 51 pages of 20, 11 of 100
    expect(Math.ceil(length / 20)).toBe(51);
    expect(Math.ceil(length / 100)).toBe(11);
  });

  it('keeps exact totals exact, even just past a cap', () => {
    expect(paginatorLength({ total: TOTAL_CAP })).toBe(TOTAL_CAP);
    expect(intl.getRangeLabel(0, 20, TOTAL_CAP)).toBe('1 – 20 of 10,000');
    expect(intl.getRangeLabel(50, 20, paginatorLength({ total: 1001 }))).toBe('1,001 – 1,001 of 1,001');
    expect(intl.getRangeLabel(1, 20, 35)).toBe('21 – 35 of 35');
    expect(intl.getRangeLabel(0, 20, 0)).toBe('0 of 0');
  });
});
