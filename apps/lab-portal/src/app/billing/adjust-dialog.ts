import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { CreditAccountView } from '@ohmprint/contracts';
import { FormSubmission, Notice } from '@ohmprint/ui';
import { BillingData } from './billing-data';

const notZero = (c: { value: unknown }) => (Number(c.value) === 0 ? { zero: true } : null);

/** Adds or removes credits by hand; the reason goes into the ledger and the audit log. */
@Component({
  selector: 'ohm-adjust-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, Notice],
  template: `
    <h2 mat-dialog-title>Adjust credits of {{ account.clientOrganisation.name }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="ohm-muted">Now {{ account.available }} available, {{ account.reserved }} held for orders. The client sees the reason in their ledger.</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <mat-form-field>
          <mat-label>Change in credits</mat-label>
          <input matInput type="number" formControlName="change" step="1" required cdkFocusInitial />
          <mat-hint>Positive adds, negative removes (only available credits can be removed)</mat-hint>
          @if (form.controls.change.invalid) { <mat-error>A whole number other than 0, at most 100000 either way.</mat-error> }
        </mat-form-field>
        <mat-form-field>
          <mat-label>Reason</mat-label>
          <textarea matInput formControlName="reason" rows="3" required maxlength="500"></textarea>
          @if (form.controls.reason.hasError('required') || form.controls.reason.hasError('minlength')) { <mat-error>Say why, in at least 5 characters.</mat-error> }
          @else if (form.controls.reason.hasError('server')) { <mat-error>Reason {{ form.controls.reason.getError('server') }}.</mat-error> }
        </mat-form-field>
        @if (saving()) {
          <mat-progress-bar mode="indeterminate" aria-label="Saving the adjustment" />
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">Adjust credits</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class AdjustDialog {
  private readonly data = inject(BillingData);
  private readonly dialogRef = inject<MatDialogRef<AdjustDialog, number>>(MatDialogRef);
  protected readonly account = inject<CreditAccountView>(MAT_DIALOG_DATA);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    change: [0, [Validators.required, Validators.min(-100000), Validators.max(100000), Validators.pattern(/^-?\d+$/), notZero]],
    reason: ['', [Validators.required, Validators.minLength(5), Validators.maxLength(500)]],
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected save(): void {
    const v = this.form.getRawValue();
    this.submission.submit(
      () => this.data.adjust({ clientOrganisationId: this.account.clientOrganisation.id, change: Number(v.change), reason: v.reason.trim() }),
      (done) => this.dialogRef.close(done.balance.available),
    );
  }
}
