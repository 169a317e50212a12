import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { REPORT_STATUSES, type ReportDetail, type ReportStatus, type ReportSummary } from '@ohmprint/contracts';
import { EmptyState, Notifier, ScreeningCaution, SearchField, ServerList, Session, VerdictChip, oneOf } from '@ohmprint/ui';
import { ReasonDialog, type ReasonDialogData } from './reason-dialog';
import { ReportFiles } from './report-files';
import { ReportStatusChip } from './report-status-chip';
import { ReportsData } from './reports-data';

@Component({
  selector: 'ohm-reports-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatButtonToggleModule, MatIconModule, MatMenuModule, SearchField, EmptyState, VerdictChip, ReportStatusChip, ScreeningCaution],
  templateUrl: './reports-page.html',
  styles: `.number { font-family: ui-monospace, monospace; font-weight: 600; white-space: nowrap; } td.ohm-row-actions { white-space: nowrap; } .filters { display: flex; flex-wrap: wrap; gap: 8px 16px; align-items: center; } .replaces { display: block; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); } .caution { margin-top: 16px; }`,
})
export class ReportsPage {
  private readonly data = inject(ReportsData);
  private readonly files = inject(ReportFiles);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  protected readonly canChange = inject(Session).hasAnyRole(['reviewer', 'lab-admin']);
  protected readonly columns = ['number', 'status', 'sample', 'client', 'verdict', 'issuedAt', 'actions'];
  protected readonly list = new ServerList<ReportSummary, { status: ReportStatus | null }>({
    sorts: ['issuedAt', 'number', 'status'],
    sort: 'issuedAt',
    dir: 'desc',
    filters: { status: oneOf(REPORT_STATUSES) },
    fetch: (query, f) => this.data.list(query, f.status),
  });

  protected download(r: ReportSummary): void {
    this.files.download(r.id, `${r.number}.pdf`);
  }

  protected change(report: ReportSummary, action: ReasonDialogData['action']): void {
    this.dialog
      .open<ReasonDialog, ReasonDialogData, ReportDetail>(ReasonDialog, { data: { report, action }, width: '560px' })
      .afterClosed()
      .subscribe((r) => {
        if (!r) return;
        this.notifier.success(action === 'amend' ? `Amendment ${r.number} issued; ${report.number} now reads as superseded.` : `${r.number} revoked.`);
        this.list.reload();
      });
  }
}
