import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { ClientRole, ClientTeamMember } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, OpenInvitations, PendingInvitations, ROLE_LABELS, SearchField, ServerList, Session, confirmAction } from '@ohmprint/ui';
import { filter, switchMap } from 'rxjs';
import { InviteMemberDialog } from './invite-member-dialog';
import { TeamData } from './team-data';

@Component({
  selector: 'ohm-team-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, ListStatus, PendingInvitations],
  templateUrl: './team-page.html',
})
export class TeamPage {
  private readonly data = inject(TeamData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly organisation = computed(() => this.session.user()?.clientOrganisation?.name ?? 'your organisation');
  protected readonly columns = computed(() => ['displayName', 'email', 'role', 'createdAt', ...(this.isAdmin() ? ['actions'] : [])]);
  protected readonly list = new ServerList<ClientTeamMember>({
    sorts: ['displayName', 'email', 'createdAt'],
    sort: 'displayName',
    dir: 'asc',
    fetch: (query) => this.data.list(query),
  });
  protected readonly invitations = new OpenInvitations(() => this.data.pendingInvitations());

  constructor() {
    if (this.isAdmin()) this.invitations.reload();
  }

  protected roleLabel(role: ClientRole): string {
    return ROLE_LABELS[role];
  }

  protected isMe(member: ClientTeamMember): boolean {
    return member.id === this.session.user()?.id;
  }

  protected openInvite(): void {
    this.invitations.invite(InviteMemberDialog).subscribe(() => this.list.reload());
  }

  protected remove(member: ClientTeamMember): void {
    confirmAction(this.dialog, {
      title: `Remove ${member.displayName} from the team?`,
      message: `${member.email} will be signed out and can no longer see ${this.organisation()}'s orders or reports. Reports already issued are not affected.`,
      confirmLabel: 'Remove',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.data.remove(member.id)),
      )
      .subscribe(() => {
        this.notifier.success(`${member.displayName} was removed from the team.`);
        this.list.reload();
      });
  }
}
