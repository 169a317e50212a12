import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { formatMoney, type CreditPackOffer } from '@ohmprint/contracts';
import { EmptyState, Notice, Session } from '@ohmprint/ui';
import { catchError, of } from 'rxjs';
import { BrowserLocation, CreditsData } from './credits-data';
import { CreditsTabs } from './credits-tabs';

@Component({
  selector: 'ohm-credits-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, EmptyState, Notice, CreditsTabs],
  templateUrl: './credits-page.html',
  styleUrl: './credits.scss',
})
export class CreditsPage {
  private readonly data = inject(CreditsData);
  private readonly location = inject(BrowserLocation);
  private readonly session = inject(Session);
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly balance = toSignal(this.data.balance().pipe(catchError(() => of(null))));
  protected readonly packs = toSignal(this.data.packs().pipe(catchError(() => of(null))));
  protected readonly buying = signal<string | null>(null);
  protected readonly money = formatMoney;

  protected perCredit(p: CreditPackOffer): string {
    return formatMoney(Math.round(p.price / p.credits), p.currency);
  }

  protected buy(pack: CreditPackOffer): void {
    this.buying.set(pack.id);
    this.data.buy(pack.id).subscribe({
      next: ({ checkoutUrl }) => this.location.assign(checkoutUrl),
      error: () => this.buying.set(null),
    });
  }
}
