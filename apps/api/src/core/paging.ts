import type { ListQuery, Page } from '@ohmprint/contracts';

/** Offset and limit for a validated list query. */
export function pageParams(query: ListQuery): { skip: number; take: number } {
  return { skip: (query.page - 1) * query.pageSize, take: query.pageSize };
}

export function toPage<T>(items: T[], total: number, query: ListQuery): Page<T> {
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/** A user's search text as a literal ILIKE pattern (their % and _ match themselves). */
export function escapeLike(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
