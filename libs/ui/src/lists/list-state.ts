import { MAX_PAGE_SIZE, type ListQuery } from '@ohmprint/contracts';

/**
 * A list's state as it lives in the URL query: `?q=&sort=&dir=&page=&pageSize=` plus the list's own
 * filters. Reading never fails: a missing, unknown or malformed value reads as the default, so an
 * edited or stale link still opens the list. Writing leaves defaults out, so a plain list has a
 * plain URL.
 */

/** One filter's reading and writing; `format` answers null for the default (left out of the URL). */
export interface ListParam<T> {
  parse(raw: string | null): T;
  format(value: T): string | null;
}

export type ListParams<F> = { readonly [K in keyof F]: ListParam<F[K]> };

export interface ListSpec<F extends object = Record<never, never>> {
  /** Columns the list may be sorted by (the API's own list). */
  readonly sorts: readonly string[];
  readonly sort: string;
  readonly dir: 'asc' | 'desc';
  /** The paginator's choices; the first page-size default is `pageSize`. */
  readonly pageSizes?: readonly number[];
  readonly pageSize?: number;
  readonly filters?: ListParams<F>;
  /** Put before every key when one page holds two lists (`lots.page`). */
  readonly prefix?: string;
}

export interface ListState<F extends object = Record<never, never>> {
  readonly q: string;
  readonly sort: string;
  readonly dir: 'asc' | 'desc';
  readonly page: number;
  readonly pageSize: number;
  readonly filters: F;
}

/** What a list reads its query parameters from (`ParamMap` and `URLSearchParams` both fit). */
export interface ParamSource {
  get(name: string): string | null;
}

export const DEFAULT_PAGE_SIZES: readonly number[] = [10, 20, 50, 100];
const MAX_SEARCH = 200;
/** Far past any real list; keeps a hand-typed `page=1e308` from reaching the API. */
const MAX_PAGE = 100_000;

export function pageSizesOf(spec: ListSpec<object>): readonly number[] {
  return (spec.pageSizes ?? DEFAULT_PAGE_SIZES).filter((n) => n <= MAX_PAGE_SIZE);
}

export function defaultPageSizeOf(spec: ListSpec<object>): number {
  const sizes = pageSizesOf(spec);
  return spec.pageSize !== undefined && sizes.includes(spec.pageSize) ? spec.pageSize : sizes.includes(20) ? 20 : sizes[0];
}

function keyOf(spec: ListSpec<object>, name: string): string {
  return spec.prefix ? `${spec.prefix}.${name}` : name;
}

function wholeNumber(raw: string | null): number | null {
  return raw !== null && /^\d{1,9}$/.test(raw) ? Number(raw) : null;
}

/** The state a URL describes, every unreadable part replaced by its default. */
export function readListState<F extends object>(spec: ListSpec<F>, params: ParamSource): ListState<F> {
  const get = (name: string) => params.get(keyOf(spec, name));
  const sort = get('sort');
  const dir = get('dir');
  const page = wholeNumber(get('page'));
  const pageSize = wholeNumber(get('pageSize'));
  const q = (get('q') ?? '').trim();
  const filters = {} as Record<string, unknown>;
  for (const [name, param] of Object.entries(spec.filters ?? {}) as [string, ListParam<unknown>][]) {
    filters[name] = param.parse(get(name));
  }
  return {
    q: q.length <= MAX_SEARCH ? q : '',
    sort: sort !== null && spec.sorts.includes(sort) ? sort : spec.sort,
    dir: dir === 'asc' || dir === 'desc' ? dir : spec.dir,
    page: page !== null && page >= 1 && page <= MAX_PAGE ? page : 1,
    pageSize: pageSize !== null && pageSizesOf(spec).includes(pageSize) ? pageSize : defaultPageSizeOf(spec),
    filters: filters as F,
  };
}

/** The query parameters that describe a state: every key of the list, null where it is the default. */
export function listStateParams<F extends object>(spec: ListSpec<F>, state: ListState<F>): Record<string, string | null> {
  const params: Record<string, string | null> = {
    [keyOf(spec, 'q')]: state.q || null,
    [keyOf(spec, 'sort')]: state.sort === spec.sort ? null : state.sort,
    [keyOf(spec, 'dir')]: state.dir === spec.dir ? null : state.dir,
    [keyOf(spec, 'page')]: state.page > 1 ? String(state.page) : null,
    [keyOf(spec, 'pageSize')]: state.pageSize === defaultPageSizeOf(spec) ? null : String(state.pageSize),
  };
  for (const [name, param] of Object.entries(spec.filters ?? {}) as [string, ListParam<unknown>][]) {
    params[keyOf(spec, name)] = param.format((state.filters as Record<string, unknown>)[name]);
  }
  return params;
}

/** The API query of a state (filters go separately, each list names its own). */
export function listQueryOf<F extends object>(state: ListState<F>): ListQuery {
  return { q: state.q || undefined, sort: state.sort, dir: state.dir, page: state.page, pageSize: state.pageSize };
}

export function sameListState<F extends object>(a: ListState<F>, b: ListState<F>): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

/** One value of a fixed set, or null (no filter). */
export function oneOf<T extends string>(values: readonly T[]): ListParam<T | null> {
  return {
    parse: (raw) => (raw !== null && values.includes(raw as T) ? (raw as T) : null),
    format: (value) => value,
  };
}

/** One value of a fixed set with a default other than "no filter" (`all` stands for no filter). */
export function oneOfOr<T extends string>(values: readonly T[], fallback: T): ListParam<T> {
  return {
    parse: (raw) => (raw !== null && values.includes(raw as T) ? (raw as T) : fallback),
    format: (value) => (value === fallback ? null : value),
  };
}

/**
 * Any number of values of a fixed set, comma-separated, in the set's order. `fallback` is what a
 * URL without the key means (the work queue starts from the states the user's roles act on); an
 * empty value means "none chosen" (every state).
 */
export function someOf<T extends string>(values: readonly T[], fallback: readonly T[] = []): ListParam<readonly T[]> {
  const ordered = (chosen: readonly T[]) => values.filter((v) => chosen.includes(v));
  const same = (a: readonly T[], b: readonly T[]) => a.length === b.length && a.every((v, i) => v === b[i]);
  return {
    parse: (raw) => {
      if (raw === null) return ordered(fallback);
      if (raw === '') return [];
      const parts = raw.split(',');
      const known = ordered(parts as T[]);
      return known.length === parts.length ? known : ordered(fallback);
    },
    format: (value) => (same(ordered(value), ordered(fallback)) ? null : ordered(value).join(',')),
  };
}

/** An on/off switch, on as `true`. */
export function onOff(): ListParam<boolean> {
  return { parse: (raw) => raw === 'true', format: (value) => (value ? 'true' : null) };
}
