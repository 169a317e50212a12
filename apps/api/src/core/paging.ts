import type { EntityManager } from 'typeorm';
import { SEARCH_TOTAL_CAP, TOTAL_CAP, type ListQuery, type Page } from '@ohmprint/contracts';

export { totalCapFor } from '@ohmprint/contracts';

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

/** A list's total as counted: the rows found (at most `cap + 1`) and the cap it was counted to. */
export interface CappedTotal {
  counted: number;
  cap: number;
}

/**
 * How many rows `fromWhere` (a `FROM … WHERE …` clause) matches, counting no further than
 * `cap + 1`: a list's total costs at most that many index entries, however long the list. Pass
 * `totalCapFor(query)`, so a search stops at a thousand (`SEARCH_TOTAL_CAP`).
 */
export async function cappedCount(manager: EntityManager, fromWhere: string, params: unknown[], cap: number = TOTAL_CAP): Promise<CappedTotal> {
  const [row]: { n: number }[] = await manager.query(`SELECT count(*)::int AS n FROM (SELECT 1 ${fromWhere} LIMIT ${cap + 1}) capped`, params);
  return { counted: row.n, cap };
}

/** A page whose total came from `cappedCount`: past its cap it says "at least the cap" ("1,000+"). */
export function toCappedPage<T>(items: T[], total: CappedTotal, query: ListQuery): Page<T> {
  return total.counted > total.cap ? { ...toPage(items, total.cap, query), totalIsLowerBound: true } : toPage(items, total.counted, query);
}

/**
 * Below this many matches a search is "sparse": as many as a search counts (`SEARCH_TOTAL_CAP`),
 * so a search that is not sparse is one whose total reads "1,000+" anyway, and its rows are dense
 * enough along the sort index that a page and the capped count stop early.
 */
export const SPARSE_MATCHES = SEARCH_TOTAL_CAP;

/**
 * The ids a search matches when they are few: each of `arms` is an id query on its own (trigram)
 * index, and each is read no further than `SPARSE_MATCHES` (a LIMIT of its own, so the planner
 * picks a plan that stops early rather than hashing whole tables). Fewer than that in all: the ids,
 * which the list then fetches by primary key (`id = ANY($n::uuid[])`, reusing the search text's
 * parameter slot). Otherwise null: a broad search is best answered by walking the list's sort index
 * and testing each row, since at least one row in sixty of a 60,000-row list matches.
 */
export async function sparseSearchIds(manager: EntityManager, arms: readonly string[], params: unknown[]): Promise<string[] | null> {
  const union = arms.map((arm) => `(${arm} LIMIT ${SPARSE_MATCHES})`).join(' UNION ALL ');
  // only the parameters the arms use are sent (PostgreSQL refuses one it cannot type), renumbered
  const used = [...new Set([...union.matchAll(/\$(\d+)/g)].map((m) => Number(m[1])))].sort((a, b) => a - b);
  const sql = union.replace(/\$(\d+)/g, (_, n: string) => `$${used.indexOf(Number(n)) + 1}`);
  const rows: { id: string }[] = await manager.query(`SELECT id FROM (${sql}) arms(id) LIMIT ${SPARSE_MATCHES}`, used.map((n) => params[n - 1]));
  return rows.length < SPARSE_MATCHES ? [...new Set(rows.map((r) => r.id))] : null;
}
