import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { formatMoney, type Payment } from '@ohmprint/contracts';
import { Session } from '@ohmprint/ui';

/** The receipt of one payment, as e-mailed when it was paid. */
@Component({
  selector: 'ohm-receipt-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>Receipt {{ p.receiptNumber }}</h2>
    <mat-dialog-content>
      <dl>
        <dt>From</dt><dd>{{ lab() }}</dd>
        <dt>For</dt><dd>{{ p.clientOrganisation.name }}</dd>
        <dt>Paid on</dt><dd>{{ p.paidAt | date: 'd MMMM y, HH:mm' }}</dd>
        <dt>Item</dt><dd>{{ p.packName }}: {{ p.credits }} test credits</dd>
        <dt>Amount</dt><dd>{{ money }}</dd>
        @if (p.refundedAt) {
          <dt>Refunded on</dt><dd>{{ p.refundedAt | date: 'd MMMM y, HH:mm' }}</dd>
        }
        @if (p.isDemo) {
          <dt>Note</dt><dd>Invented demo payment: no money moved.</dd>
        }
      </dl>
    </mat-dialog-content>
    <mat-dialog-actions align="end"><button mat-button type="button" mat-dialog-close cdkFocusInitial>Close</button></mat-dialog-actions>
  `,
  styles: `
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 8px 24px; margin: 0; }
    dt { font: var(--mat-sys-label-large); color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; }
  `,
})
export class ReceiptDialog {
  protected readonly p = inject<Payment>(MAT_DIALOG_DATA);
  protected readonly money = formatMoney(this.p.amount, this.p.currency);
  private readonly session = inject(Session);
  protected readonly lab = computed(() => this.session.user()?.lab?.name ?? 'Your lab');
}
