import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { LedgerEntry } from '@ohmprint/contracts';
import { EmptyState, ListStatus, SearchField, ServerList } from '@ohmprint/ui';
import { CreditsData } from './credits-data';
import { CreditsTabs } from './credits-tabs';
import { LEDGER_KIND_LOOK } from './payment-state';

@Component({
  selector: 'ohm-ledger-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatIconModule, SearchField, EmptyState, ListStatus, CreditsTabs],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Credits</h1>
        <p>Every movement of your organisation's credits, newest first: what happened, why, what it refers to, who did it, and the balances after it. Entries are never changed or removed.</p>
      </div>
    </header>
    <ohm-credits-tabs>
      <ohm-search-field label="Search by reason, sample code or person" [initial]="list.state().q" (queryChange)="list.search($event)" />
      <div class="ohm-table-card">
        @if (list.loading()) {
          <mat-progress-bar mode="indeterminate" aria-label="Loading the ledger" />
        }
        <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Credit ledger">
          <ng-container matColumnDef="entryNo">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>When</th>
            <td mat-cell *matCellDef="let e">{{ e.createdAt | date: 'd MMM y, HH:mm' }}</td>
          </ng-container>
          <ng-container matColumnDef="kind">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Movement</th>
            <td mat-cell *matCellDef="let e"><span class="state"><mat-icon aria-hidden="true">{{ look(e).icon }}</mat-icon>{{ look(e).label }}</span></td>
          </ng-container>
          <ng-container matColumnDef="change">
            <th mat-header-cell *matHeaderCellDef>Change</th>
            <td mat-cell *matCellDef="let e">{{ change(e) }}</td>
          </ng-container>
          <ng-container matColumnDef="reason">
            <th mat-header-cell *matHeaderCellDef>Reason and reference</th>
            <td mat-cell *matCellDef="let e">{{ e.reason }}<br /><span class="ohm-muted">{{ e.reference.label }}</span></td>
          </ng-container>
          <ng-container matColumnDef="actor">
            <th mat-header-cell class="ohm-wide-only" *matHeaderCellDef>By</th>
            <td mat-cell class="ohm-wide-only" *matCellDef="let e">{{ e.actor?.displayName ?? 'The lab’s system' }}</td>
          </ng-container>
          <ng-container matColumnDef="after">
            <th mat-header-cell *matHeaderCellDef>Balance after</th>
            <td mat-cell *matCellDef="let e">{{ e.availableAfter }} available<br /><span class="ohm-muted">{{ e.reservedAfter }} held</span></td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
        <ohm-list-status [list]="list" failedHeading="The ledger could not be loaded" noMatch="No movement matches" searchHint="Try a word from the reason, a sample code or a name.">
          <ohm-empty-state icon="receipt_long" heading="No movements yet">
            <p>When your organisation buys credits or orders a check, each movement appears here.</p>
          </ohm-empty-state>
        </ohm-list-status>
        <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Ledger pages" />
      </div>
    </ohm-credits-tabs>
  `,
  styleUrl: './credits.scss',
})
export class LedgerPage {
  private readonly data = inject(CreditsData);
  protected readonly columns = ['entryNo', 'kind', 'change', 'reason', 'actor', 'after'];
  protected readonly list = new ServerList<LedgerEntry>({
    sorts: ['entryNo', 'kind'],
    sort: 'entryNo',
    dir: 'desc',
    fetch: (query) => this.data.ledger(query),
  });

  protected look(e: LedgerEntry): { label: string; icon: string } {
    return LEDGER_KIND_LOOK[e.kind];
  }

  /** The change in words: "+10 available", "−1 available, +1 held". */
  protected change(e: LedgerEntry): string {
    const part = (n: number, what: string) => (n === 0 ? null : `${n > 0 ? '+' : '−'}${Math.abs(n)} ${what}`);
    return [part(e.availableChange, 'available'), part(e.reservedChange, 'held')].filter(Boolean).join(', ');
  }
}
