import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import type { ClientRole, Invitation } from '@ohmprint/contracts';
import { FormSubmission, InviteeEmailField, Notice } from '@ohmprint/ui';
import { TeamData } from './team-data';

@Component({
  selector: 'ohm-invite-member-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatRadioModule, MatProgressBarModule, InviteeEmailField, Notice],
  template: `
    <h2 mat-dialog-title>Invite a colleague</h2>
    <form [formGroup]="form" (ngSubmit)="invite()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">They get an e-mail with a link to choose their name and password. The link works once.</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <ohm-invitee-email-field [control]="form.controls.email" [focusFirst]="true" />
        <fieldset>
          <legend>What they may do</legend>
          <mat-radio-group formControlName="role" class="roles" aria-label="Role">
            <mat-radio-button value="client-member">
              <span class="choice">Member</span>
              <span class="hint">Sees orders and downloads reports.</span>
            </mat-radio-button>
            <mat-radio-button value="client-admin">
              <span class="choice">Admin</span>
              <span class="hint">Also manages products, orders, credits and the team.</span>
            </mat-radio-button>
          </mat-radio-group>
        </fieldset>
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
  styles: `
    .roles {
      display: flex;
      flex-direction: column;
    }
    .choice {
      display: block;
    }
    .hint {
      display: block;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class InviteMemberDialog {
  private readonly data = inject(TeamData);
  private readonly dialogRef = inject<MatDialogRef<InviteMemberDialog, Invitation>>(MatDialogRef);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    role: ['client-member' as ClientRole, Validators.required],
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
