import { DestroyRef, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { MatPaginator } from '@angular/material/paginator';
import type { MatSort } from '@angular/material/sort';
import type { ListQuery, Page } from '@ohmprint/contracts';
import { paginatorLength } from './capped-paginator-intl';
import { Subject, catchError, map, merge, of, startWith, switchMap, tap, type Observable } from 'rxjs';

export interface ServerListSources<T> {
  readonly sort: MatSort;
  readonly paginator: MatPaginator;
  /** Search text as typed (already debounced by SearchField). */
  readonly search: Observable<string>;
  readonly fetch: (query: ListQuery) => Observable<Page<T>>;
  readonly destroyRef: DestroyRef;
}

/**
 * A server-side table's state: sort, page and search changes become one query each, and only the
 * latest answer counts (switchMap). Errors were already reported by the problem interceptor;
 * the table keeps its rows and says the list could not be loaded.
 */
export class ServerList<T> {
  readonly rows = signal<readonly T[]>([]);
  readonly total = signal(0);
  readonly loading = signal(true);
  readonly failed = signal(false);
  readonly searchText = signal('');
  private readonly reloads = new Subject<void>();

  connect({ sort, paginator, search, fetch, destroyRef }: ServerListSources<T>): void {
    const sortChanges = sort.sortChange.pipe(tap(() => (paginator.pageIndex = 0)));
    const searchChanges = search.pipe(
      tap((text) => {
        this.searchText.set(text.trim());
        paginator.pageIndex = 0;
      }),
    );
    merge(sortChanges, paginator.page, searchChanges, this.reloads)
      .pipe(
        startWith(null),
        map(
          (): ListQuery => ({
            q: this.searchText() || undefined,
            sort: sort.active,
            dir: sort.direction || 'asc',
            page: paginator.pageIndex + 1,
            pageSize: paginator.pageSize,
          }),
        ),
        tap(() => this.loading.set(true)),
        switchMap((query) =>
          fetch(query).pipe(
            catchError(() => {
              this.failed.set(true);
              return of(null);
            }),
          ),
        ),
        takeUntilDestroyed(destroyRef),
      )
      .subscribe((page) => {
        this.loading.set(false);
        if (!page) return;
        this.failed.set(false);
        this.rows.set(page.items);
        this.total.set(paginatorLength(page));
      });
  }

  /** Fetch the current page again (after an invite, a role change...). */
  reload(): void {
    this.reloads.next();
  }
}
