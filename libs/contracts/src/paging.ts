import { z } from 'zod';

export const MAX_PAGE_SIZE = 100;

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

/** A page of a list: `{ items, total, page, pageSize }`. */
export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({
    items: z.array(item),
    total: z.number().int().min(0),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
  });
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ListQuery<S extends string = string> {
  q?: string;
  sort: S;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}
