import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Invitation, LabRole } from '@ohmprint/contracts';
import { FormSubmission, InviteeEmailField, Notice } from '@ohmprint/ui';
import { RolesPicker } from './roles-picker';
import { StaffData } from './staff-data';

@Component({
  selector: 'ohm-invite-staff-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatProgressBarModule, RolesPicker, InviteeEmailField, Notice],
  template: `
    <h2 mat-dialog-title>Invite a colleague</h2>
    <form [formGroup]="form" (ngSubmit)="invite()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">They get an e-mail with a link to choose their name and password. The link works once.</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <ohm-invitee-email-field [control]="form.controls.email" requiredMessage="Enter their work e-mail address." [focusFirst]="true" />
        <ohm-roles-picker [control]="form.controls.roles" />
        @if (saving()) {
          <mat-progress-bar mode="indeterminate" aria-label="Sending the invitation" />
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">Send invitation</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class InviteStaffDialog {
  private readonly data = inject(StaffData);
  private readonly dialogRef = inject<MatDialogRef<InviteStaffDialog, Invitation>>(MatDialogRef);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    roles: [[] as LabRole[], Validators.required],
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected invite(): void {
    this.submission.submit(
      () => this.data.invite(this.form.getRawValue()),
      (invitation) => this.dialogRef.close(invitation),
    );
  }
}
