import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { LabSummary } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, SearchField, ServerList, dialogResult } from '@ohmprint/ui';
import { ChangeLabStatusDialog } from './change-lab-status-dialog';
import { CreateLabDialog } from './create-lab-dialog';
import { LabsData, type LabCreated } from './labs-data';

@Component({
  selector: 'ohm-labs-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, ListStatus],
  templateUrl: './labs-page.html',
})
export class LabsPage {
  private readonly data = inject(LabsData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['name', 'legalName', 'status', 'staffCount', 'createdAt', 'actions'];
  protected readonly list = new ServerList<LabSummary>({
    sorts: ['name', 'createdAt', 'status'],
    sort: 'name',
    dir: 'asc',
    fetch: (query) => this.data.list(query),
  });

  protected openCreate(): void {
    dialogResult<CreateLabDialog, LabCreated>(this.dialog, CreateLabDialog).subscribe(({ lab, invitation }) => {
      this.notifier.success(`${lab.name} was created; an invitation went to ${invitation.email}.`);
      this.list.reload();
    });
  }

  protected changeStatus(lab: LabSummary): void {
    dialogResult<ChangeLabStatusDialog, LabSummary, LabSummary>(this.dialog, ChangeLabStatusDialog, lab).subscribe((updated) => {
      this.notifier.success(`${updated.name} is now ${updated.status}.`);
      this.list.reload();
    });
  }
}
