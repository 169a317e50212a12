import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { ReportSummary } from '@ohmprint/contracts';
import { EmptyState, ScreeningCaution, SearchField, ServerList, VerdictChip } from '@ohmprint/ui';
import { ClientReportsData } from './client-reports-data';
import { reportStanding } from './report-standing';

@Component({
  selector: 'ohm-client-reports-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, VerdictChip, ScreeningCaution],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Reports</h1>
        <p>Signed test reports for your samples. Each carries a verification code: anyone you share a report with can check it on the public verification page.</p>
      </div>
    </header>
    <ohm-screening-caution class="caution" />
    <ohm-search-field label="Search by report number, sample code or product" [initial]="list.state().q" (queryChange)="list.search($event)" />
    <div class="ohm-table-card">
      @if (list.loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading reports" />
      }
      <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Reports">
        <ng-container matColumnDef="number">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Report</th>
          <td mat-cell *matCellDef="let r"><span class="number">{{ r.number }}</span>
            @if (r.replacesNumber) { <span class="note">replaces {{ r.replacesNumber }}</span> }
            <span class="ohm-narrow-only"><span class="note">{{ r.sampleCode }} · {{ r.productName }} · {{ r.issuedAt | date: 'd MMM y' }}</span>
              @if (r.status !== 'revoked') { <ohm-verdict-chip [verdict]="r.verdict" [compact]="true" /> }</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="sample">
          <th mat-header-cell class="ohm-wide-only" *matHeaderCellDef>Sample</th>
          <td mat-cell class="ohm-wide-only" *matCellDef="let r">{{ r.sampleCode }} · {{ r.productName }}</td>
        </ng-container>
        <ng-container matColumnDef="verdict">
          <th mat-header-cell class="ohm-wide-only" *matHeaderCellDef>Result</th>
          <td mat-cell class="ohm-wide-only" *matCellDef="let r">
            @if (r.status === 'revoked') {
              <span class="ohm-status ohm-warning"><mat-icon aria-hidden="true">block</mat-icon>Withdrawn</span>
            } @else {
              <ohm-verdict-chip [verdict]="r.verdict" [compact]="true" />
              @if (r.status === 'superseded') { <span class="note">no longer current</span> }
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="status">
          <th mat-header-cell *matHeaderCellDef>Status</th>
          <td mat-cell *matCellDef="let r"><span class="ohm-status" [class.ohm-warning]="r.status !== 'issued'"><mat-icon aria-hidden="true">{{ statusOf(r).icon }}</mat-icon>{{ statusOf(r).label }}</span>
            @if (r.revocationReason) { <span class="note">{{ r.revocationReason }}</span> }</td>
        </ng-container>
        <ng-container matColumnDef="issuedAt">
          <th mat-header-cell class="ohm-wide-only" *matHeaderCellDef mat-sort-header>Issued</th>
          <td mat-cell class="ohm-wide-only" *matCellDef="let r">{{ r.issuedAt | date: 'd MMM y' }}</td>
        </ng-container>
        <ng-container matColumnDef="download">
          <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Download</span></th>
          <td mat-cell *matCellDef="let r"><button mat-stroked-button type="button" [attr.aria-label]="pdfLabel(r) + ' of ' + r.number" (click)="data.download(r)"><mat-icon>download</mat-icon><span class="ohm-wide-only">{{ pdfLabel(r) }}</span></button></td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
      @if (!list.loading() && list.rows().length === 0) {
        @if (list.searchText()) {
          <ohm-empty-state icon="search_off" heading="No report matches “{{ list.searchText() }}”"><p>Try the report number printed at the top of the PDF, or clear the search.</p></ohm-empty-state>
        } @else {
          <ohm-empty-state icon="description" heading="No reports yet"><p>A report arrives by e-mail and appears here once the lab has measured your sample and a second person has reviewed the result.</p></ohm-empty-state>
        }
      }
      <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Report pages" />
    </div>
  `,
  styles: `
    .number { font-family: ui-monospace, monospace; font-weight: 600; white-space: nowrap; }
    .note { display: block; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .caution { margin-bottom: 16px; }
  `,
})
export class ClientReportsPage {
  protected readonly data = inject(ClientReportsData);
  protected readonly columns = ['number', 'sample', 'verdict', 'status', 'issuedAt', 'download'];

  /** The button's words, also the start of its accessible name (what is seen is what is said). */
  protected pdfLabel(r: { status: string }): string {
    return r.status === 'issued' ? 'PDF' : r.status === 'revoked' ? 'Revoked PDF' : 'Old PDF';
  }
  protected readonly list = new ServerList<ReportSummary>({
    sorts: ['issuedAt', 'number', 'status'],
    sort: 'issuedAt',
    dir: 'desc',
    pageSizes: [10, 20, 50],
    fetch: (query) => this.data.list(query),
  });

  protected statusOf(r: ReportSummary): { icon: string; label: string } {
    return reportStanding(r) ?? { icon: 'verified', label: 'Issued' };
  }

}
