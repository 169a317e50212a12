import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { SampleStateChip } from '@ohmprint/ui';
import { catchError, of } from 'rxjs';
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
        <p class="ohm-muted">No order is open at the moment. Checks are ordered by your organisation's admins against a product's published reference library.</p>
      } @else {
        <ul>
          @for (o of page.items; track o.id) {
            <li>
              <span>{{ o.product.name }}, ordered {{ o.placedAt | date: 'd MMM' }}</span>
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
  protected readonly orders = toSignal(inject(OrdersData).open(5).pipe(catchError(() => of(null))));
}
