import { Injectable } from '@angular/core';
import { MatPaginatorIntl } from '@angular/material/paginator';
import { TOTAL_CAP } from '@ohmprint/contracts';

/**
 * The paginator's range label when a list's total is only a lower bound: `ServerList` gives the
 * paginator `TOTAL_CAP + 1` rows for a capped total, and this says "of 10,000+" for it.
 */
@Injectable()
export class CappedPaginatorIntl extends MatPaginatorIntl {
  override getRangeLabel = (page: number, pageSize: number, length: number): string => {
    if (length <= TOTAL_CAP) return new MatPaginatorIntl().getRangeLabel(page, pageSize, length);
    const start = page * pageSize;
    return `${(start + 1).toLocaleString('en-GB')} – ${(start + pageSize).toLocaleString('en-GB')} of ${TOTAL_CAP.toLocaleString('en-GB')}+`;
  };
}

/** The paginator length for a page of a list: one past the cap when the total is a lower bound. */
export function paginatorLength(page: { total: number; totalIsLowerBound?: boolean }): number {
  return page.totalIsLowerBound ? TOTAL_CAP + 1 : page.total;
}
