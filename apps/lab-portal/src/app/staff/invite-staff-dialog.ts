import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Invitation, LabRole } from '@ohmprint/contracts';
import { ApiProblem, Notice, showFieldErrors } from '@ohmprint/ui';
import { RolesPicker } from './roles-picker';
import { StaffData } from './staff-data';

@Component({
  selector: 'ohm-invite-staff-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, RolesPicker, Notice],
  template: `
    <h2 mat-dialog-title>Invite a colleague</h2>
    <form [formGroup]="form" (ngSubmit)="invite()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">They get an e-mail with a link to choose their name and password. The link works once.</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <mat-form-field>
          <mat-label>E-mail</mat-label>
          <input matInput type="email" formControlName="email" required cdkFocusInitial />
          @if (form.controls.email.hasError('required')) {
            <mat-error>Enter their work e-mail address.</mat-error>
          } @else if (form.controls.email.hasError('email')) {
            <mat-error>That doesn't look like an e-mail address.</mat-error>
          } @else if (form.controls.email.hasError('server')) {
            <mat-error>E-mail {{ form.controls.email.getError('server') }}.</mat-error>
          }
        </mat-form-field>
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
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);

  protected invite(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.data.invite(this.form.getRawValue()).subscribe({
      next: (invitation) => this.dialogRef.close(invitation),
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
      },
    });
  }
}
