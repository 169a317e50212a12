import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, signal, computed, inject, viewChild, type AfterViewInit } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { ClientRole, ClientTeamMember, Invitation } from '@ohmprint/contracts';
import { EmptyState, Notifier, PendingInvitations, ROLE_LABELS, SearchField, ServerList, Session, confirmAction } from '@ohmprint/ui';
import { Subject, filter, switchMap } from 'rxjs';
import { InviteMemberDialog } from './invite-member-dialog';
import { TeamData } from './team-data';

@Component({
  selector: 'ohm-team-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, PendingInvitations],
  templateUrl: './team-page.html',
})
export class TeamPage implements AfterViewInit {
  private readonly data = inject(TeamData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  private readonly destroyRef = inject(DestroyRef);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly organisation = computed(() => this.session.user()?.clientOrganisation?.name ?? 'your organisation');
  protected readonly columns = computed(() => ['displayName', 'email', 'role', 'createdAt', ...(this.isAdmin() ? ['actions'] : [])]);
  protected readonly list = new ServerList<ClientTeamMember>();
  protected readonly search = new Subject<string>();
  protected readonly pending = signal<readonly Invitation[]>([]);
  protected readonly pendingTotal = signal(0);

  ngAfterViewInit(): void {
    this.list.connect({
      sort: this.sort(),
      paginator: this.paginator(),
      search: this.search,
      fetch: (query) => this.data.list(query),
      destroyRef: this.destroyRef,
    });
    this.loadPending();
  }

  private loadPending(): void {
    if (!this.isAdmin()) return;
    this.data.pendingInvitations().subscribe((page) => {
      this.pending.set(page.items);
      this.pendingTotal.set(page.total);
    });
  }

  protected roleLabel(role: ClientRole): string {
    return ROLE_LABELS[role];
  }

  protected isMe(member: ClientTeamMember): boolean {
    return member.id === this.session.user()?.id;
  }

  protected openInvite(): void {
    this.dialog
      .open<InviteMemberDialog, void, Invitation>(InviteMemberDialog)
      .afterClosed()
      .pipe(filter((invitation): invitation is Invitation => !!invitation))
      .subscribe((invitation) => {
        this.notifier.success(`Invitation sent to ${invitation.email}.`);
        this.list.reload();
        this.loadPending();
      });
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
