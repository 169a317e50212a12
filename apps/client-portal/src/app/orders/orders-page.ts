import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal, viewChild, type AfterViewInit } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { OrderStatus, OrderSummary } from '@ohmprint/contracts';
import { EmptyState, SampleStateChip, ScreeningCaution, SearchField, ServerList } from '@ohmprint/ui';
import { Subject } from 'rxjs';
import { ORDER_STATUS_LOOK } from './order-status';
import { OrdersData } from './orders-data';

@Component({
  selector: 'ohm-orders-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatButtonToggleModule, MatIconModule, SearchField, EmptyState, SampleStateChip, ScreeningCaution],
  templateUrl: './orders-page.html',
  styles: `
    .filters { display: flex; flex-wrap: wrap; gap: 8px 16px; align-items: center; }
    .filters mat-button-toggle-group { max-width: 100%; overflow-x: auto; }
    .samples { list-style: none; margin: 0; padding: 4px 0; display: flex; flex-direction: column; gap: 4px; }
    .samples li { display: flex; gap: 8px; align-items: center; flex-wrap: wrap; }
    .code { font-family: ui-monospace, monospace; font-weight: 600; }
    .caution { margin-top: 16px; }
  `,
})
export class OrdersPage implements AfterViewInit {
  private readonly data = inject(OrdersData);
  private readonly destroyRef = inject(DestroyRef);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);
  protected readonly columns = ['placedAt', 'product', 'status', 'samples', 'credits'];
  protected readonly list = new ServerList<OrderSummary>();
  protected readonly search = new Subject<string>();
  protected readonly status = signal<OrderStatus | null>(null);

  ngAfterViewInit(): void {
    this.list.connect({ sort: this.sort(), paginator: this.paginator(), search: this.search, fetch: (q) => this.data.list(q, this.status()), destroyRef: this.destroyRef });
  }

  protected statusOf(status: OrderStatus): (typeof ORDER_STATUS_LOOK)[OrderStatus] {
    return ORDER_STATUS_LOOK[status];
  }

  protected filter(status: OrderStatus | null): void {
    this.status.set(status);
    this.paginator().pageIndex = 0;
    this.list.reload();
  }
}
