import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { AnalysisListItem } from '@ohmprint/contracts';
import { EmptyState, SearchField, ServerList, Session, VerdictChip } from '@ohmprint/ui';
import { AnalysesData } from '../analyses/analyses-data';

/** Analyses submitted for review, oldest submission first; my own are marked (four-eyes rule). */
@Component({
  selector: 'ohm-review-queue',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, SearchField, EmptyState, VerdictChip],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Reviews</h1>
        <p>Analyses waiting for a second person. Approving issues the signed report; you cannot review an analysis you ran yourself.</p>
      </div>
    </header>
    <ohm-search-field label="Search by sample code or product" [initial]="list.state().q" (queryChange)="list.search($event)" />
    <div class="ohm-table-card">
      @if (list.loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading reviews" />
      }
      <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Analyses awaiting review">
        <ng-container matColumnDef="sample">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Sample</th>
          <td mat-cell *matCellDef="let a"><a class="code" [routerLink]="['/reviews', a.id]">{{ a.sampleCode }}</a></td>
        </ng-container>
        <ng-container matColumnDef="product">
          <th mat-header-cell *matHeaderCellDef>Product</th>
          <td mat-cell *matCellDef="let a">{{ a.productName }}</td>
        </ng-container>
        <ng-container matColumnDef="verdict">
          <th mat-header-cell *matHeaderCellDef>Proposed verdict</th>
          <td mat-cell *matCellDef="let a"><ohm-verdict-chip [verdict]="a.verdict" [compact]="true" /></td>
        </ng-container>
        <ng-container matColumnDef="analyst">
          <th mat-header-cell *matHeaderCellDef>Analyst</th>
          <td mat-cell *matCellDef="let a">{{ a.analyst.displayName }}@if (a.analyst.id === myId()) { <span class="ohm-you">(you — someone else must review)</span> }</td>
        </ng-container>
        <ng-container matColumnDef="submittedAt">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Submitted</th>
          <td mat-cell *matCellDef="let a">{{ a.submittedAt | date: 'd MMM y, HH:mm' }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
      @if (!list.loading() && list.rows().length === 0) {
        @if (list.searchText()) {
          <ohm-empty-state icon="search_off" heading="No analysis matches “{{ list.searchText() }}”"><p>Clear the search to see every analysis waiting.</p></ohm-empty-state>
        } @else {
          <ohm-empty-state icon="rate_review" heading="Nothing to review"><p>Analyses appear here when an analyst submits them.</p></ohm-empty-state>
        }
      }
      <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Review pages" />
    </div>
  `,
  styles: `.code { font-family: ui-monospace, monospace; font-weight: 600; }`,
})
export class ReviewQueue {
  private readonly data = inject(AnalysesData);
  private readonly session = inject(Session);
  protected readonly myId = () => this.session.user()?.id;
  protected readonly columns = ['sample', 'product', 'verdict', 'analyst', 'submittedAt'];
  protected readonly list = new ServerList<AnalysisListItem>({
    sorts: ['createdAt', 'submittedAt', 'sample', 'status'],
    sort: 'submittedAt',
    dir: 'asc',
    pageSizes: [10, 20, 50],
    fetch: (query) => this.data.awaitingReview(query),
  });

}
