import { z } from 'zod';

export const MAX_PAGE_SIZE = 100;

/**
 * Lists count matching rows only up to this many: past it `total` is this number and
 * `totalIsLowerBound` is true ("10,000+"), so a long list never costs a count of every row.
 */
export const TOTAL_CAP = 10_000;

/**
 * A search (`q`) counts its matches only up to this many: past it `total` is this number and
 * `totalIsLowerBound` is true ("1,000+ matches"). A broad search then costs at most this many
 * matching rows, since no one pages through a thousand matches to find one.
 */
export const SEARCH_TOTAL_CAP = 1_000;

/** How far a list with this query counts its rows: `SEARCH_TOTAL_CAP` for a search, else `TOTAL_CAP`. */
export function totalCapFor(query: { q?: string }): number {
  return query.q ? SEARCH_TOTAL_CAP : TOTAL_CAP;
}

/**
 * The query every list accepts: `?q=&sort=&dir=&page=&pageSize=`.
 * `sortFields` names the columns a list may be sorted by; the first is the default.
 */
export function listQuery<const S extends readonly [string, ...string[]]>(sortFields: S, defaultDir: 'asc' | 'desc' = 'asc') {
  return z.object({
    q: z.string().trim().max(200).optional(),
    sort: z.enum(sortFields).default(sortFields[0] as S[number] & string),
    dir: z.enum(['asc', 'desc']).default(defaultDir),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(20),
  });
}

/**
 * A page of a list: `{ items, total, page, pageSize, totalIsLowerBound? }`. When
 * `totalIsLowerBound` is true there are more than `total` matching rows (see `TOTAL_CAP` and
 * `SEARCH_TOTAL_CAP`).
 */
export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({
    items: z.array(item),
    total: z.number().int().min(0),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
    totalIsLowerBound: z.boolean().optional(),
  });
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
  /** true when there are more than `total` rows (the count stopped at `TOTAL_CAP`, or `SEARCH_TOTAL_CAP` for a search) */
  totalIsLowerBound?: boolean;
}

/** "1,234", "1,000+" or "10,000+" for a page's total. */
export function totalLabel(page: Pick<Page<unknown>, 'total' | 'totalIsLowerBound'>): string {
  return `${page.total.toLocaleString('en-GB')}${page.totalIsLowerBound ? '+' : ''}`;
}

export interface ListQuery<S extends string = string> {
  q?: string;
  sort: S;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}
