import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { StaffMember } from '@ohmprint/contracts';
import { FormSubmission, Notice } from '@ohmprint/ui';
import { RolesPicker } from './roles-picker';
import { StaffData } from './staff-data';

@Component({
  selector: 'ohm-change-roles-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatProgressBarModule, RolesPicker, Notice],
  template: `
    <h2 mat-dialog-title>Roles of {{ member.displayName }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">{{ member.email }}. Changes apply at their next sign-in or token refresh (within minutes).</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <ohm-roles-picker [control]="form.controls.roles" />
        @if (saving()) {
          <mat-progress-bar mode="indeterminate" aria-label="Saving roles" />
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving() || form.pristine">Save roles</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class ChangeRolesDialog {
  private readonly data = inject(StaffData);
  private readonly dialogRef = inject<MatDialogRef<ChangeRolesDialog, StaffMember>>(MatDialogRef);
  protected readonly member = inject<StaffMember>(MAT_DIALOG_DATA);
  protected readonly form = inject(NonNullableFormBuilder).group({ roles: [[...this.member.roles], Validators.required] });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected save(): void {
    this.submission.submit(
      () => this.data.changeRoles(this.member.id, this.form.getRawValue()),
      (updated) => this.dialogRef.close(updated),
    );
  }
}
