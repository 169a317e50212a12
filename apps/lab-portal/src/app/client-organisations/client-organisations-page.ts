import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, viewChild, type AfterViewInit } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { ClientOrganisation } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, SearchField, ServerList, dialogResult } from '@ohmprint/ui';
import { Subject } from 'rxjs';
import { ClientOrganisationsData, type OrganisationCreated } from './client-organisations-data';
import { InviteOrganisationDialog } from './invite-organisation-dialog';

@Component({
  selector: 'ohm-client-organisations-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, ListStatus],
  templateUrl: './client-organisations-page.html',
})
export class ClientOrganisationsPage implements AfterViewInit {
  private readonly data = inject(ClientOrganisationsData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly destroyRef = inject(DestroyRef);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  protected readonly columns = ['name', 'contactEmail', 'memberCount', 'createdAt'];
  protected readonly list = new ServerList<ClientOrganisation>();
  protected readonly search = new Subject<string>();

  ngAfterViewInit(): void {
    this.list.connect({
      sort: this.sort(),
      paginator: this.paginator(),
      search: this.search,
      fetch: (query) => this.data.list(query),
      destroyRef: this.destroyRef,
    });
  }

  protected openInvite(): void {
    dialogResult<InviteOrganisationDialog, OrganisationCreated>(this.dialog, InviteOrganisationDialog).subscribe(({ organisation, invitation }) => {
      this.notifier.success(`${organisation.name} was added; an invitation went to ${invitation.email}.`);
      this.list.reload();
    });
  }
}
