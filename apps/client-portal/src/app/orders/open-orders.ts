import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { SampleStateChip } from '@ohmprint/ui';
import { catchError, forkJoin, map, of } from 'rxjs';
import { ORDER_STATUS_LOOK } from './order-status';
import { OrdersData } from './orders-data';

/** Home-page card: orders the lab is still working on. */
@Component({
  selector: 'ohm-open-orders',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatButtonModule, SampleStateChip],
  template: `
    <h3>Open orders</h3>
    @if (orders(); as page) {
      @if (page.items.length === 0) {
        <p class="ohm-muted">No order is open at the moment. Checks are ordered by your organisation's admins against a product's published reference library, from the Orders page.</p>
      } @else {
        <ul>
          @for (o of page.items; track o.id) {
            <li>
              <a [routerLink]="['/orders', o.id]">{{ o.product.name }}, ordered {{ o.placedAt | date: 'd MMM' }}</a>
              <span class="ohm-muted">{{ look[o.status].label }}</span>
              @for (s of o.samples; track s.id) {
                <span class="sample"><code>{{ s.code }}</code> <ohm-sample-state-chip [state]="s.state" /></span>
              }
            </li>
          }
        </ul>
      }
      <a mat-button routerLink="/orders">All orders ({{ page.total }} open)</a>
    }
  `,
  styles: `
    h3 { font: var(--mat-sys-title-medium); margin: 0 0 8px; }
    ul { list-style: none; padding: 0; margin: 0 0 8px; display: flex; flex-direction: column; gap: 8px; }
    li { display: flex; flex-wrap: wrap; gap: 4px 12px; align-items: center; }
    .sample { display: inline-flex; gap: 4px; align-items: center; }
  `,
})
export class OpenOrders {
  private readonly data = inject(OrdersData);
  protected readonly look = ORDER_STATUS_LOOK;
  /** Waiting for the samples or at the lab: both are open. */
  protected readonly orders = toSignal(
    forkJoin([this.data.open(5, 'in-progress'), this.data.open(5, 'placed')]).pipe(
      map(([busy, placed]) => ({
        items: [...busy.items, ...placed.items].sort((a, b) => b.placedAt.localeCompare(a.placedAt)).slice(0, 5),
        total: busy.total + placed.total,
      })),
      catchError(() => of(null)),
    ),
  );
}
