import type { EntityManager } from 'typeorm';
import { TOTAL_CAP, type ListQuery, type Page } from '@ohmprint/contracts';

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

/**
 * How many rows `fromWhere` (a `FROM … WHERE …` clause) matches, counting no further than
 * `TOTAL_CAP + 1`: a list's total costs at most that many index entries, however long the list.
 */
export async function cappedCount(manager: EntityManager, fromWhere: string, params: unknown[]): Promise<number> {
  const [row]: { n: number }[] = await manager.query(`SELECT count(*)::int AS n FROM (SELECT 1 ${fromWhere} LIMIT ${TOTAL_CAP + 1}) capped`, params);
  return row.n;
}

/** A page whose total came from `cappedCount`: past the cap it says "at least `TOTAL_CAP`". */
export function toCappedPage<T>(items: T[], counted: number, query: ListQuery): Page<T> {
  return counted > TOTAL_CAP ? { ...toPage(items, TOTAL_CAP, query), totalIsLowerBound: true } : toPage(items, counted, query);
}

/** Below this many matches a search is "sparse". */
export const SPARSE_MATCHES = 200;

/**
 * The ids a search matches when they are few: `arms` is a UNION ALL of id queries, each on its own
 * (trigram) index, read no further than `SPARSE_MATCHES`. Fewer than that: the ids, which the list
 * then fetches by primary key (`id = ANY($n::uuid[])`, reusing the search text's parameter slot).
 * Otherwise null: a broad search is best answered by walking the list's sort index and testing
 * each row, since the first page's rows come within the first few hundred.
 */
export async function sparseSearchIds(manager: EntityManager, arms: string, params: unknown[]): Promise<string[] | null> {
  // only the parameters the arms use are sent (PostgreSQL refuses one it cannot type), renumbered
  const used = [...new Set([...arms.matchAll(/\$(\d+)/g)].map((m) => Number(m[1])))].sort((a, b) => a - b);
  const sql = arms.replace(/\$(\d+)/g, (_, n: string) => `$${used.indexOf(Number(n)) + 1}`);
  const rows: { id: string }[] = await manager.query(`SELECT id FROM (${sql} LIMIT ${SPARSE_MATCHES}) arms(id)`, used.map((n) => params[n - 1]));
  return rows.length < SPARSE_MATCHES ? [...new Set(rows.map((r) => r.id))] : null;
}
