import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal, viewChild, type AfterViewInit } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSort, MatSortModule, type SortDirection } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { ORDER_KINDS, ORDER_STATUSES, type ListQuery, type OrderKind, type OrderStatus, type OrderSummary } from '@ohmprint/contracts';
import { EmptyState, SampleStateChip, ScreeningCaution, SearchField, ServerList, Session } from '@ohmprint/ui';
import { Subject } from 'rxjs';
import { ORDER_STATUS_LOOK } from './order-status';
import { OrdersData } from './orders-data';

const SORTS = ['placedAt', 'status', 'product'];
const oneOf = <T extends string>(value: string | null, allowed: readonly T[]): T | null => (allowed.includes(value as T) ? (value as T) : null);

/** The organisation's orders; filters, sort, page and search live in the URL, so a link or Back shows the same list. */
@Component({
  selector: 'ohm-orders-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatButtonToggleModule,
    MatIconModule, SearchField, EmptyState, SampleStateChip, ScreeningCaution],
  templateUrl: './orders-page.html',
  styles: `
    .filters { display: flex; flex-wrap: wrap; gap: 8px 16px; align-items: center; margin-bottom: 8px; }
    .filters mat-button-toggle-group { max-width: 100%; overflow-x: auto; }
    .samples { list-style: none; margin: 0; padding: 4px 0; display: flex; flex-direction: column; gap: 4px; }
    .samples li { display: flex; gap: 8px; align-items: center; flex-wrap: wrap; }
    .code { font-family: ui-monospace, monospace; font-weight: 600; }
    .caution { display: block; margin-top: 16px; }
    a.order { color: inherit; font-weight: 600; }
    .kind { display: block; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
  `,
})
export class OrdersPage implements AfterViewInit {
  private readonly data = inject(OrdersData);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  private readonly session = inject(Session);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);
  private readonly params = inject(ActivatedRoute).snapshot.queryParamMap;
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly columns = ['placedAt', 'product', 'status', 'samples', 'credits'];
  protected readonly list = new ServerList<OrderSummary>();
  protected readonly search = new Subject<string>();
  protected readonly status = signal<OrderStatus | null>(oneOf(this.params.get('status'), ORDER_STATUSES));
  protected readonly kind = signal<OrderKind | null>(oneOf(this.params.get('kind'), ORDER_KINDS));
  protected readonly initialSearch = this.params.get('q') ?? '';
  protected readonly initialSort = oneOf(this.params.get('sort'), SORTS) ?? 'placedAt';
  protected readonly initialDir: SortDirection = this.params.get('dir') === 'asc' ? 'asc' : 'desc';
  protected readonly initialPageSize = [10, 20, 50].includes(Number(this.params.get('pageSize'))) ? Number(this.params.get('pageSize')) : 20;
  protected readonly filtered = computed(() => !!this.status() || !!this.kind());

  ngAfterViewInit(): void {
    this.paginator().pageIndex = Math.max(0, (Number(this.params.get('page')) || 1) - 1);
    this.list.searchText.set(this.initialSearch.trim());
    this.list.connect({ sort: this.sort(), paginator: this.paginator(), search: this.search, fetch: (q) => this.fetch(q), destroyRef: this.destroyRef });
  }

  private fetch(q: ListQuery) {
    void this.router.navigate([], {
      queryParams: { q: q.q || null, status: this.status(), kind: this.kind(), sort: q.sort === 'placedAt' ? null : q.sort,
        dir: q.dir === 'desc' ? null : q.dir, page: q.page > 1 ? q.page : null, pageSize: q.pageSize === 20 ? null : q.pageSize },
      replaceUrl: true,
    });
    return this.data.list(q, this.status(), this.kind());
  }

  protected statusOf(status: OrderStatus): (typeof ORDER_STATUS_LOOK)[OrderStatus] {
    return ORDER_STATUS_LOOK[status];
  }

  protected filter(status: OrderStatus | null): void {
    this.status.set(status);
    this.paginator().pageIndex = 0;
    this.list.reload();
  }

  protected filterKind(kind: OrderKind | null): void {
    this.kind.set(kind);
    this.paginator().pageIndex = 0;
    this.list.reload();
  }
}
