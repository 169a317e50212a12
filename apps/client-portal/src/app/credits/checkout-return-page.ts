import { ChangeDetectionStrategy, Component, DestroyRef, OnInit, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { CheckoutStatus } from '@ohmprint/contracts';
import { Notice } from '@ohmprint/ui';
import { catchError, of, switchMap, take, takeWhile, timer } from 'rxjs';
import { CreditsData } from './credits-data';
import { PAYMENT_STATE_LOOK } from './payment-state';

const POLL_MS = 1000;
const GIVE_UP_AFTER = 60;

/**
 * Where the payment page sends the user back: after paying ("bought") it waits until the payment
 * service's confirmation has added the credits; after going back without paying ("not-bought") it
 * closes the checkout so it cannot be paid by accident later.
 */
@Component({
  selector: 'ohm-checkout-return-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, Notice],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>{{ outcome() === 'bought' ? 'Thank you for your payment' : 'No payment was made' }}</h1>
      </div>
    </header>
    <section class="outcome" aria-live="polite">
      @switch (view()) {
        @case ('waiting') {
          <p>Waiting for the payment service to confirm the payment. Your credits appear as soon as it does; this usually takes a few seconds.</p>
          <mat-progress-bar mode="indeterminate" aria-label="Waiting for the payment to be confirmed" />
        }
        @case ('credited') {
          <ohm-notice tone="success" icon="check_circle">
            {{ status()!.credits }} credits from “{{ status()!.packName }}” were added. You now have <strong>{{ status()!.balance.available }}</strong> credits available.
            A receipt is on its way to your e-mail.
          </ohm-notice>
        }
        @case ('slow') {
          <ohm-notice tone="info" icon="schedule">
            The payment has not been confirmed yet. If you paid, the credits are added as soon as the confirmation arrives; the payments page shows its state. Nothing is charged twice.
          </ohm-notice>
        }
        @case ('nothing') {
          <ohm-notice tone="info" icon="info">
            {{ explain() }} You can buy a pack again at any time.
          </ohm-notice>
        }
        @case ('unknown') {
          <ohm-notice tone="error" icon="error">This checkout is not one of your organisation's. Open the payments page to see your payments.</ohm-notice>
        }
      }
      <div class="actions">
        <a mat-flat-button routerLink="/credits">Back to credits</a>
        <a mat-stroked-button routerLink="/credits/ledger">Ledger</a>
        <a mat-stroked-button routerLink="/credits/payments">Payments</a>
      </div>
    </section>
  `,
  styleUrl: './credits.scss',
})
export class CheckoutReturnPage implements OnInit {
  private readonly data = inject(CreditsData);
  private readonly destroyRef = inject(DestroyRef);
  /** From the route's data. */
  readonly outcome = input<'bought' | 'not-bought'>('bought');
  /** `?session=` from the payment page's return address. */
  readonly session = input<string>('');
  protected readonly status = signal<CheckoutStatus | null>(null);
  protected readonly view = signal<'waiting' | 'credited' | 'slow' | 'nothing' | 'unknown'>('waiting');
  protected readonly explain = signal('No money was taken and no credits were added.');

  ngOnInit(): void {
    const session = this.session();
    if (!session) {
      this.view.set('unknown');
      return;
    }
    if (this.outcome() === 'not-bought') {
      this.data.abandon(session).pipe(catchError(() => this.data.checkout(session).pipe(catchError(() => of(null))))).subscribe((s) => this.settle(s));
      return;
    }
    let polls = 0;
    timer(0, POLL_MS).pipe(
      switchMap(() => this.data.checkout(session).pipe(catchError(() => of(null)))),
      takeWhile((s) => {
        polls += 1;
        this.status.set(s);
        return (s === null || s.status === 'open' || s.status === 'declined') && polls < GIVE_UP_AFTER;
      }, true),
      take(GIVE_UP_AFTER + 1),
      takeUntilDestroyed(this.destroyRef),
    ).subscribe({ complete: () => this.settle(this.status()) });
  }

  private settle(s: CheckoutStatus | null): void {
    this.status.set(s);
    if (!s) return this.view.set(this.outcome() === 'bought' ? 'slow' : 'unknown');
    if (s.status === 'paid') return this.view.set('credited');
    if (s.status === 'open') return this.view.set(this.outcome() === 'bought' ? 'slow' : 'nothing');
    this.explain.set(`${PAYMENT_STATE_LOOK[s.status].label}: ${PAYMENT_STATE_LOOK[s.status].explain}`);
    this.view.set('nothing');
  }
}
