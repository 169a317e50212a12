import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { PAYMENT_STATES, PAYMENT_STATE_WORDS, formatMoney, type Payment, type PaymentState } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, SearchField, ServerList, oneOf, confirmAction } from '@ohmprint/ui';
import { filter, switchMap } from 'rxjs';
import { BillingData } from './billing-data';
import { BillingTabs } from './billing-tabs';

const ICONS: Record<PaymentState, string> = { open: 'hourglass_top', paid: 'check_circle', declined: 'credit_card_off', expired: 'block', refunded: 'undo' };

@Component({
  selector: 'ohm-lab-payments-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatButtonToggleModule, MatIconModule,
    SearchField, EmptyState, ListStatus, BillingTabs],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Billing</h1>
        <p>Every client's credit-pack payments. A paid pack can be refunded while its credits are still unused.</p>
      </div>
    </header>
    <ohm-billing-tabs>
      <div class="filters">
        <ohm-search-field label="Search by client, pack, receipt or checkout id" [initial]="list.state().q" (queryChange)="list.search($event)" />
        <mat-button-toggle-group aria-label="Filter by state" [ngModel]="list.filters().status" (ngModelChange)="list.filter({ status: $event })">
          <mat-button-toggle [value]="null">All</mat-button-toggle>
          <mat-button-toggle value="paid">Paid</mat-button-toggle>
          <mat-button-toggle value="refunded">Refunded</mat-button-toggle>
          <mat-button-toggle value="declined">Declined</mat-button-toggle>
          <mat-button-toggle value="expired">Not completed</mat-button-toggle>
          <mat-button-toggle value="open">Waiting</mat-button-toggle>
        </mat-button-toggle-group>
      </div>
      <div class="ohm-table-card">
        @if (list.loading()) {
          <mat-progress-bar mode="indeterminate" aria-label="Loading payments" />
        }
        <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Payments">
          <ng-container matColumnDef="createdAt">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Started</th>
            <td mat-cell *matCellDef="let p">{{ p.createdAt | date: 'd MMM y, HH:mm' }}</td>
          </ng-container>
          <ng-container matColumnDef="receipt">
            <th mat-header-cell *matHeaderCellDef>Receipt</th>
            <td mat-cell *matCellDef="let p"><code>{{ p.receiptNumber }}</code>@if (p.isDemo) { <span class="ohm-muted"> (demo)</span> }</td>
          </ng-container>
          <ng-container matColumnDef="client">
            <th mat-header-cell *matHeaderCellDef>Client</th>
            <td mat-cell *matCellDef="let p">{{ p.clientOrganisation.name }}</td>
          </ng-container>
          <ng-container matColumnDef="pack">
            <th mat-header-cell *matHeaderCellDef>Pack</th>
            <td mat-cell *matCellDef="let p">{{ p.packName }} <span class="ohm-muted">· {{ p.credits }} cr.</span></td>
          </ng-container>
          <ng-container matColumnDef="amount">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Amount</th>
            <td mat-cell *matCellDef="let p">{{ money(p) }}</td>
          </ng-container>
          <ng-container matColumnDef="status">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>State</th>
            <td mat-cell *matCellDef="let p">
              <span class="ohm-status"><mat-icon aria-hidden="true">{{ icon(p.status) }}</mat-icon>{{ words(p.status) }}</span>
              @if (p.refundedBy) { <br /><span class="ohm-muted">by {{ p.refundedBy.displayName }}, {{ p.refundedAt | date: 'd MMM y' }}</span> }
              @if (p.failureMessage) { <br /><span class="ohm-muted">{{ p.failureMessage }}</span> }
            </td>
          </ng-container>
          <ng-container matColumnDef="actions">
            <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Actions</span></th>
            <td mat-cell *matCellDef="let p">
              @if (p.status === 'paid' && !p.isDemo) {
                <button mat-button type="button" (click)="refund(p)" [attr.aria-label]="'Refund ' + p.receiptNumber">Refund</button>
              }
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
        <ohm-list-status [list]="list" failedHeading="The payments could not be loaded" noMatch="No payment matches" searchHint="Try a client name, a pack or a receipt number such as R-000012.">
          <ohm-empty-state icon="payments" heading="No payments yet">
            <p>When a client buys a credit pack, the payment appears here.</p>
          </ohm-empty-state>
        </ohm-list-status>
        <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Payment pages" />
      </div>
    </ohm-billing-tabs>
  `,
  styles: `.filters { display: flex; flex-wrap: wrap; gap: 4px 16px; align-items: center; }`,
})
export class LabPaymentsPage {
  private readonly data = inject(BillingData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  protected readonly columns = ['createdAt', 'receipt', 'client', 'pack', 'amount', 'status', 'actions'];
  protected readonly list = new ServerList<Payment, { status: PaymentState | null }>({
    sorts: ['createdAt', 'amount', 'status'],
    sort: 'createdAt',
    dir: 'desc',
    filters: { status: oneOf(PAYMENT_STATES) },
    fetch: (query, f) => this.data.payments(query, f.status),
  });

  protected icon(s: PaymentState): string {
    return ICONS[s];
  }

  protected words(s: PaymentState): string {
    return PAYMENT_STATE_WORDS[s];
  }

  protected money(p: Payment): string {
    return formatMoney(p.amount, p.currency);
  }

  protected refund(p: Payment): void {
    confirmAction(this.dialog, {
      title: `Refund ${p.receiptNumber}?`,
      message: `${this.money(p)} goes back to ${p.clientOrganisation.name} and ${p.credits} credits leave their balance. This works only while those credits are unused.`,
      confirmLabel: 'Refund',
      destructive: true,
    }).pipe(filter(Boolean), switchMap(() => this.data.refund(p.id))).subscribe((done) => {
      this.notifier.success(`${done.receiptNumber} was refunded; ${done.credits} credits were removed.`);
      this.list.reload();
    });
  }
}
