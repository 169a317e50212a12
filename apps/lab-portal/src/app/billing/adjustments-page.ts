import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { CreditAccountView } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, SearchField, ServerList, dialogResult } from '@ohmprint/ui';
import { AdjustDialog } from './adjust-dialog';
import { BillingData } from './billing-data';
import { BillingTabs } from './billing-tabs';

@Component({
  selector: 'ohm-adjustments-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, SearchField, EmptyState, ListStatus, BillingTabs],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Billing</h1>
        <p>Each client's credits. Correct a balance by hand when needed (goodwill, a partial refund settled outside the payment service); every adjustment needs a reason and is audited.</p>
      </div>
    </header>
    <ohm-billing-tabs>
      <ohm-search-field label="Search by client" [initial]="list.state().q" (queryChange)="list.search($event)" />
      <div class="ohm-table-card">
        @if (list.loading()) {
          <mat-progress-bar mode="indeterminate" aria-label="Loading credit balances" />
        }
        <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Client credits">
          <ng-container matColumnDef="name">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Client</th>
            <td mat-cell *matCellDef="let a">{{ a.clientOrganisation.name }}</td>
          </ng-container>
          <ng-container matColumnDef="available">
            <th mat-header-cell *matHeaderCellDef mat-sort-header>Available</th>
            <td mat-cell *matCellDef="let a">{{ a.available }}</td>
          </ng-container>
          <ng-container matColumnDef="reserved">
            <th mat-header-cell *matHeaderCellDef>Held</th>
            <td mat-cell *matCellDef="let a">{{ a.reserved }}</td>
          </ng-container>
          <ng-container matColumnDef="updatedAt">
            <th mat-header-cell class="ohm-wide-only" *matHeaderCellDef>Last movement</th>
            <td mat-cell class="ohm-wide-only" *matCellDef="let a">{{ a.updatedAt ? (a.updatedAt | date: 'd MMM y, HH:mm') : '—' }}</td>
          </ng-container>
          <ng-container matColumnDef="actions">
            <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Actions</span></th>
            <td mat-cell *matCellDef="let a">
              <button mat-button type="button" (click)="adjust(a)" [attr.aria-label]="'Adjust credits of ' + a.clientOrganisation.name">Adjust</button>
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
        <ohm-list-status [list]="list" failedHeading="The balances could not be loaded" noMatch="No client matches" searchHint="Try part of the client's name.">
          <ohm-empty-state icon="storefront" heading="No clients yet">
            <p>Client organisations appear here once they are invited.</p>
          </ohm-empty-state>
        </ohm-list-status>
        <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Client pages" />
      </div>
    </ohm-billing-tabs>
  `,
})
export class AdjustmentsPage {
  private readonly data = inject(BillingData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  protected readonly columns = ['name', 'available', 'reserved', 'updatedAt', 'actions'];
  protected readonly list = new ServerList<CreditAccountView>({
    sorts: ['name', 'available'],
    sort: 'name',
    dir: 'asc',
    fetch: (query) => this.data.accounts(query),
  });

  protected adjust(a: CreditAccountView): void {
    dialogResult<AdjustDialog, number, CreditAccountView>(this.dialog, AdjustDialog, a).subscribe((available) => {
      this.notifier.success(`${a.clientOrganisation.name} now has ${available} credits available.`);
      this.list.reload();
    });
  }
}
