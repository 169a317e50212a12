import { Injectable } from '@angular/core';
import { MatPaginatorIntl } from '@angular/material/paginator';

const count = (n: number) => n.toLocaleString('en-GB');

/**
 * The paginator's range label, with digit grouping ("of 6,000"), and "of 1,000+" / "of 10,000+"
 * when a list's total is only a lower bound. Any list can be capped (`TOTAL_CAP` for a list,
 * `SEARCH_TOTAL_CAP` for a search), so the bound travels in the length itself: `paginatorLength`
 * gives the paginator half a row more than a capped total. Exact totals are whole numbers, so an
 * exact 1,001 is never read as a bound, and the half row lets the paginator offer the page after
 * the cap's last full one, since there are more rows.
 */
@Injectable()
export class CappedPaginatorIntl extends MatPaginatorIntl {
  override getRangeLabel = (page: number, pageSize: number, length: number): string => {
    const isLowerBound = !Number.isInteger(length);
    const total = Math.max(0, Math.floor(length));
    const of = `of ${count(total)}${isLowerBound ? '+' : ''}`;
    if (total === 0 || pageSize === 0) return `0 ${of}`;
    const start = page * pageSize;
    const end = start < total && !isLowerBound ? Math.min(start + pageSize, total) : start + pageSize;
    return `${count(start + 1)} – ${count(end)} ${of}`;
  };
}

/** The paginator length for a page of a list: half a row past the total when it is a lower bound. */
export function paginatorLength(page: { total: number; totalIsLowerBound?: boolean }): number {
  return page.totalIsLowerBound ? page.total + 0.5 : page.total;
}

