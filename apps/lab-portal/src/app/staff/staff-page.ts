import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import type { LabRole, StaffMember } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, OpenInvitations, PendingInvitations, ROLE_LABELS, SearchField, ServerList, Session, confirmAction, dialogResult } from '@ohmprint/ui';
import { filter, switchMap } from 'rxjs';
import { ChangeRolesDialog } from './change-roles-dialog';
import { InviteStaffDialog } from './invite-staff-dialog';
import { StaffData } from './staff-data';

@Component({
  selector: 'ohm-staff-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatTableModule,
    MatSortModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatChipsModule,
    SearchField,
    EmptyState,
    ListStatus,
    PendingInvitations,
  ],
  templateUrl: './staff-page.html',
})
export class StaffPage {
  private readonly data = inject(StaffData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  protected readonly columns = ['displayName', 'email', 'roles', 'status', 'createdAt', 'actions'];
  protected readonly list = new ServerList<StaffMember>({
    sorts: ['displayName', 'email', 'createdAt'],
    sort: 'displayName',
    dir: 'asc',
    fetch: (query) => this.data.list(query),
  });
  protected readonly invitations = new OpenInvitations(() => this.data.pendingInvitations());

  constructor() {
    this.invitations.reload();
  }

  protected roleLabel(role: LabRole): string {
    return ROLE_LABELS[role];
  }

  protected isMe(member: StaffMember): boolean {
    return member.id === this.session.user()?.id;
  }

  protected openInvite(): void {
    this.invitations.invite(InviteStaffDialog).subscribe(() => this.list.reload());
  }

  protected changeRoles(member: StaffMember): void {
    dialogResult<ChangeRolesDialog, StaffMember, StaffMember>(this.dialog, ChangeRolesDialog, member).subscribe((updated) => {
      this.notifier.success(`Roles of ${updated.displayName} saved.`);
      this.list.reload();
    });
  }

  protected deactivate(member: StaffMember): void {
    confirmAction(this.dialog, {
      title: `Deactivate ${member.displayName}?`,
      message: `${member.email} will be signed out everywhere and can no longer sign in. Their past work, signatures and audit entries stay as they are.`,
      confirmLabel: 'Deactivate',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.data.deactivate(member.id)),
      )
      .subscribe(() => {
        this.notifier.success(`${member.displayName} was deactivated.`);
        this.list.reload();
      });
  }

  protected reactivate(member: StaffMember): void {
    this.data.reactivate(member.id).subscribe(() => {
      this.notifier.success(`${member.displayName} can sign in again.`);
      this.list.reload();
    });
  }
}
