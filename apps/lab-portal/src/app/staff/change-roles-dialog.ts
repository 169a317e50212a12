import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { StaffMember } from '@ohmprint/contracts';
import { ApiProblem, Notice, showFieldErrors } from '@ohmprint/ui';
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
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.data.changeRoles(this.member.id, this.form.getRawValue()).subscribe({
      next: (updated) => this.dialogRef.close(updated),
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
      },
    });
  }
}
