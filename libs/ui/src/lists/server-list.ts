import { DestroyRef, computed, inject, signal, type Signal, type WritableSignal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';
import { ActivatedRoute, Router } from '@angular/router';
import type { ListQuery, Page } from '@ohmprint/contracts';
import { paginatorLength } from './capped-paginator-intl';
import { Subject, catchError, combineLatest, distinctUntilChanged, map, merge, of, switchMap, tap, type Observable } from 'rxjs';
import { listQueryOf, listStateParams, pageSizesOf, readListState, sameListState, type ListSpec, type ListState } from './list-state';

export interface ServerListOptions<T, F extends object> extends ListSpec<F> {
  readonly fetch: (query: ListQuery, filters: F) => Observable<Page<T>>;
  /**
   * What the rows belong to, when that is an input (a library version's lots): read as a signal,
   * so the first request waits until inputs are set, and a new value fetches again.
   */
  readonly scope?: () => unknown;
}

/** What a list's status message reads (`ListStatus`); any server list fits. */
export interface ListView {
  readonly rows: Signal<readonly unknown[]>;
  readonly loading: Signal<boolean>;
  readonly failed: Signal<boolean>;
  readonly searchText: Signal<string>;
  reload(): void;
}

/**
 * A server-side table whose search, filters, sort and page live in the URL query: a reload or a
 * shared link opens the same list, Back and Forward step through what the user chose, and an
 * unreadable value reads as its default. The URL is the one source of truth: the table's controls
 * ask for a new URL, and every URL (or `reload()`) becomes one request; only the latest answer
 * counts (switchMap). Errors were already reported by the problem interceptor; the table keeps its
 * rows and says the list could not be loaded.
 *
 * Create it in a field initializer (it injects the router). The template binds the state:
 * `matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir"
 * (matSortChange)="list.sortBy($event)"`, `<mat-paginator [pageIndex]="list.state().page - 1"
 * [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)">`
 * and `<ohm-search-field [initial]="list.state().q" (queryChange)="list.search($event)">`.
 */
export class ServerList<T, F extends object = Record<never, never>> implements ListView {
  readonly rows = signal<readonly T[]>([]);
  readonly total = signal(0);
  readonly loading = signal(true);
  readonly failed = signal(false);
  readonly pageSizes: readonly number[];
  private readonly current: WritableSignal<ListState<F>>;
  readonly state: Signal<ListState<F>>;
  readonly filters: Signal<F>;
  readonly searchText: Signal<string>;
  private readonly router = inject(Router);
  private readonly reloads = new Subject<void>();

  constructor(private readonly options: ServerListOptions<T, F>) {
    const route = inject(ActivatedRoute);
    this.pageSizes = pageSizesOf(options);
    this.current = signal(readListState(options, route.snapshot?.queryParamMap ?? { get: () => null }));
    this.state = this.current.asReadonly();
    this.filters = computed(() => this.current().filters);
    this.searchText = computed(() => this.current().q);
    const fromUrl = route.queryParamMap.pipe(
      map((params) => readListState(options, params)),
      distinctUntilChanged((a: ListState<F>, b: ListState<F>) => sameListState(a, b)),
      tap((state) => this.current.set(state)),
    );
    const scope = options.scope ? toObservable(computed(options.scope)) : of(null);
    merge(combineLatest([fromUrl, scope]).pipe(map(([state]) => state)), this.reloads.pipe(map(() => this.current())))
      .pipe(
        tap(() => this.loading.set(true)),
        switchMap((state) =>
          options.fetch(listQueryOf(state), state.filters).pipe(
            map((page) => ({ state, page })),
            catchError(() => {
              this.failed.set(true);
              return of(null);
            }),
          ),
        ),
        takeUntilDestroyed(inject(DestroyRef)),
      )
      .subscribe((answer) => {
        this.loading.set(false);
        if (!answer) return;
        const { state, page } = answer;
        this.failed.set(false);
        this.rows.set(page.items);
        this.total.set(paginatorLength(page));
        const last = Math.max(1, Math.ceil(page.total / state.pageSize));
        // A link to a page that no longer exists (rows were removed since) opens the last one.
        if (page.items.length === 0 && state.page > last) this.show({ page: last }, true);
      });
  }

  /** New search text: back to the first page. Refining a search replaces its history entry. */
  search(text: string): void {
    const q = text.trim();
    if (q === this.current().q) return;
    this.show({ q, page: 1 }, this.current().q !== '' && q !== '');
  }

  sortBy(sort: Sort): void {
    this.show({ sort: sort.active, dir: sort.direction || this.options.dir, page: 1 });
  }

  turn(event: PageEvent): void {
    this.show({ page: event.pageIndex + 1, pageSize: event.pageSize });
  }

  /** Change some filters: back to the first page. */
  filter(patch: Partial<F>): void {
    this.show({ filters: { ...this.current().filters, ...patch }, page: 1 });
  }

  /** Fetch the current page again (after an invite, a role change...). */
  reload(): void {
    this.reloads.next();
  }

  private show(patch: Partial<ListState<F>>, replaceUrl = false): void {
    const next = { ...this.current(), ...patch };
    if (sameListState(next, this.current())) return;
    if (this.leaving()) return;
    void this.router.navigate([], { queryParams: listStateParams(this.options, next), queryParamsHandling: 'merge', replaceUrl });
  }

  /**
   * A navigation to another page is under way (a row's link was followed while a search was still
   * settling): a late search, sort or page change must not cancel it and pull the person back.
   */
  private leaving(): boolean {
    const navigation = this.router.currentNavigation();
    if (!navigation) return false;
    const pathOf = (url: string) => url.split(/[?#]/)[0];
    return pathOf(this.router.serializeUrl(navigation.extractedUrl)) !== pathOf(this.router.url);
  }
}
