import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { ClientOrganisation } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, SearchField, ServerList, dialogResult } from '@ohmprint/ui';
import { ClientOrganisationsData, type OrganisationCreated } from './client-organisations-data';
import { InviteOrganisationDialog } from './invite-organisation-dialog';

@Component({
  selector: 'ohm-client-organisations-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, ListStatus],
  templateUrl: './client-organisations-page.html',
})
export class ClientOrganisationsPage {
  private readonly data = inject(ClientOrganisationsData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['name', 'contactEmail', 'memberCount', 'createdAt'];
  protected readonly list = new ServerList<ClientOrganisation>({
    sorts: ['name', 'createdAt'],
    sort: 'name',
    dir: 'asc',
    fetch: (query) => this.data.list(query),
  });

  protected openInvite(): void {
    dialogResult<InviteOrganisationDialog, OrganisationCreated>(this.dialog, InviteOrganisationDialog).subscribe(({ organisation, invitation }) => {
      this.notifier.success(`${organisation.name} was added; an invitation went to ${invitation.email}.`);
      this.list.reload();
    });
  }
}
