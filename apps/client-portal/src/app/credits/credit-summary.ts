import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { Session } from '@ohmprint/ui';
import { catchError, of } from 'rxjs';
import { CreditsData } from './credits-data';

/** Home-page card: credits available and held, and the way to buy more. */
@Component({
  selector: 'ohm-credit-summary',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButtonModule, MatIconModule],
  template: `
    <h3>Test credits</h3>
    @if (balance(); as b) {
      <dl>
        <div><dt>Available</dt><dd data-testid="credits-available">{{ b.available }}</dd></div>
        <div><dt>Held for open orders</dt><dd data-testid="credits-reserved">{{ b.reserved }}</dd></div>
      </dl>
      <p class="ohm-muted">Each check costs credits; they are held when you order and spent when the report is issued.</p>
    } @else {
      <p class="ohm-muted">Your balance could not be loaded just now.</p>
    }
    <div class="actions">
      @if (isAdmin()) {
        <a mat-flat-button routerLink="/credits"><mat-icon>add_card</mat-icon>Buy credits</a>
      }
      <a mat-button routerLink="/credits/ledger">Ledger</a>
    </div>
  `,
  styles: `
    h3 { font: var(--mat-sys-title-medium); margin: 0 0 8px; }
    dl { display: flex; gap: 32px; margin: 0 0 8px; }
    dt { font: var(--mat-sys-label-large); color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; font: var(--mat-sys-display-small); }
    .actions { display: flex; gap: 8px; flex-wrap: wrap; }
  `,
})
export class CreditSummary {
  private readonly session = inject(Session);
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly balance = toSignal(inject(CreditsData).balance(true).pipe(catchError(() => of(null))));
}
