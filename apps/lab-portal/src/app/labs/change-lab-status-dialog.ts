import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { LabSummary } from '@ohmprint/contracts';
import { FormSubmission, Notice } from '@ohmprint/ui';
import { LabsData } from './labs-data';

/** Suspending needs a reason (it is audited); reactivating asks for one too, for the record. */
@Component({
  selector: 'ohm-change-lab-status-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, Notice],
  template: `
    <h2 mat-dialog-title>{{ suspending ? 'Suspend' : 'Reactivate' }} {{ lab.name }}?</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">
          @if (suspending) {
            Its staff and clients can no longer sign in until it is reactivated. Nothing is deleted.
          } @else {
            Its staff and clients can sign in again.
          }
        </p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <mat-form-field>
          <mat-label>Reason</mat-label>
          <textarea matInput formControlName="reason" rows="3" required cdkFocusInitial></textarea>
          <mat-hint>Kept in the audit log.</mat-hint>
          @if (form.controls.reason.hasError('required')) {
            <mat-error>Say why, for the audit log.</mat-error>
          } @else if (form.controls.reason.hasError('minlength')) {
            <mat-error>Use at least 3 characters.</mat-error>
          } @else if (form.controls.reason.hasError('server')) {
            <mat-error>Reason {{ form.controls.reason.getError('server') }}.</mat-error>
          }
        </mat-form-field>
        @if (saving()) {
          <mat-progress-bar mode="indeterminate" aria-label="Saving" />
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [class.ohm-destructive]="suspending" [disabled]="saving()">
          {{ suspending ? 'Suspend lab' : 'Reactivate lab' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
})
export class ChangeLabStatusDialog {
  private readonly data = inject(LabsData);
  private readonly dialogRef = inject<MatDialogRef<ChangeLabStatusDialog, LabSummary>>(MatDialogRef);
  protected readonly lab = inject<LabSummary>(MAT_DIALOG_DATA);
  protected readonly suspending = this.lab.status === 'active';
  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: ['', [Validators.required, Validators.minLength(3), Validators.maxLength(500)]],
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected save(): void {
    const status = this.suspending ? 'suspended' : 'active';
    this.submission.submit(
      () => this.data.changeStatus(this.lab.id, { status, reason: this.form.getRawValue().reason }),
      (updated) => this.dialogRef.close(updated),
    );
  }
}
