import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { ORDER_KINDS, ORDER_STATUSES, type OrderKind, type OrderStatus, type OrderSummary } from '@ohmprint/contracts';
import { EmptyState, SampleStateChip, ScreeningCaution, SearchField, ServerList, Session, oneOf } from '@ohmprint/ui';
import { ORDER_STATUS_LOOK } from './order-status';
import { OrdersData } from './orders-data';

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
export class OrdersPage {
  private readonly data = inject(OrdersData);
  private readonly session = inject(Session);
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly columns = ['placedAt', 'product', 'status', 'samples', 'credits'];
  protected readonly list = new ServerList<OrderSummary, { status: OrderStatus | null; kind: OrderKind | null }>({
    sorts: ['placedAt', 'status', 'product'],
    sort: 'placedAt',
    dir: 'desc',
    pageSizes: [10, 20, 50],
    filters: { status: oneOf(ORDER_STATUSES), kind: oneOf(ORDER_KINDS) },
    fetch: (query, f) => this.data.list(query, f.status, f.kind),
  });
  protected readonly filtered = computed(() => !!this.list.filters().status || !!this.list.filters().kind);

  protected sampleCodes(order: OrderSummary): string {
    return order.samples.map((s) => s.code).join(', ');
  }

  protected statusOf(status: OrderStatus): (typeof ORDER_STATUS_LOOK)[OrderStatus] {
    return ORDER_STATUS_LOOK[status];
  }
}
