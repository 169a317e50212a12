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
import { PAYMENT_STATES, formatMoney, type Payment, type PaymentState } from '@ohmprint/contracts';
import { EmptyState, ListStatus, SearchField, ServerList, oneOf } from '@ohmprint/ui';
import { CreditsData } from './credits-data';
import { CreditsTabs } from './credits-tabs';
import { PAYMENT_STATE_LOOK } from './payment-state';
import { ReceiptDialog } from './receipt-dialog';

@Component({
  selector: 'ohm-payments-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatButtonToggleModule, MatIconModule,
    SearchField, EmptyState, ListStatus, CreditsTabs],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Credits</h1>
        <p>Every credit pack your organisation started to buy, and what became of it. Only paid payments added credits; declined and unfinished ones took no money.</p>
      </div>
    </header>
    <ohm-credits-tabs>
      <div class="filters">
        <ohm-search-field label="Search by pack or receipt number" [initial]="list.state().q" (queryChange)="list.search($event)" />
        <mat-button-toggle-group aria-label="Filter by state" [ngModel]="list.filters().status" (ngModelChange)="list.filter({ status: $event })">
          <mat-button-toggle [value]="null">All</mat-button-toggle>
          <mat-button-toggle value="paid">Paid</mat-button-toggle>
          <mat-button-toggle value="refunded">Refunded</mat-button-toggle>
          <mat-button-toggle value="declined">Declined</mat-button-toggle>
          <mat-button-toggle value="expired">Not completed</mat-button-toggle>
        </mat-button-toggle-group>
      </div>
      <div class="ohm-table-card">
        @if (list.loading()) {
          <mat-progress-bar mode="indeterminate" aria-label="Loading payments" />
        }
        <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Payments">
          <ng-container matColumnDef="createdAt">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Started</th>
            <td mat-cell *matCellDef="let p">{{ p.createdAt | date: 'd MMM y, HH:mm' }}<br /><span class="ohm-muted">by {{ p.startedBy?.displayName ?? '—' }}</span></td>
          </ng-container>
          <ng-container matColumnDef="pack">
            <th mat-header-cell *matHeaderCellDef>Pack</th>
            <td mat-cell *matCellDef="let p">{{ p.packName }}<br /><span class="ohm-muted">{{ p.credits }} credits</span></td>
          </ng-container>
          <ng-container matColumnDef="amount">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Amount</th>
            <td mat-cell *matCellDef="let p">{{ money(p) }}</td>
          </ng-container>
          <ng-container matColumnDef="status">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>State</th>
            <td mat-cell *matCellDef="let p">
              <span class="state"><mat-icon aria-hidden="true">{{ look(p.status).icon }}</mat-icon>{{ look(p.status).label }}</span>
              <br /><span class="ohm-muted">{{ p.failureMessage ?? look(p.status).explain }}</span>
            </td>
          </ng-container>
          <ng-container matColumnDef="receipt">
            <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Receipt</span></th>
            <td mat-cell *matCellDef="let p">
              @if (p.status === 'paid' || p.status === 'refunded') {
                <button mat-button type="button" (click)="openReceipt(p)" [attr.aria-label]="'Receipt ' + p.receiptNumber">Receipt</button>
              }
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
        <ohm-list-status [list]="list" failedHeading="The payments could not be loaded" noMatch="No payment matches" searchHint="Try part of the pack name or a receipt number such as R-000012.">
          <ohm-empty-state icon="payments" heading="No payments yet">
            <p>When your organisation buys a credit pack, the payment and its receipt appear here.</p>
          </ohm-empty-state>
        </ohm-list-status>
        <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Payment pages" />
      </div>
    </ohm-credits-tabs>
  `,
  styleUrl: './credits.scss',
})
export class PaymentsPage {
  private readonly data = inject(CreditsData);
  private readonly dialog = inject(MatDialog);
  protected readonly columns = ['createdAt', 'pack', 'amount', 'status', 'receipt'];
  protected readonly list = new ServerList<Payment, { status: PaymentState | null }>({
    sorts: ['createdAt', 'amount', 'status'],
    sort: 'createdAt',
    dir: 'desc',
    filters: { status: oneOf(PAYMENT_STATES) },
    fetch: (query, f) => this.data.payments(query, f.status),
  });

  protected look(s: PaymentState) {
    return PAYMENT_STATE_LOOK[s];
  }

  protected money(p: Payment): string {
    return formatMoney(p.amount, p.currency);
  }

  protected openReceipt(p: Payment): void {
    this.dialog.open(ReceiptDialog, { data: p });
  }
}
