import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { SampleDetail } from '@ohmprint/contracts';
import { ApiProblem } from '@ohmprint/ui';
import { IntakeData } from './intake-data';

/** Rejecting cannot be undone and the client is told the reason, so it is asked for and confirmed. */
@Component({
  selector: 'ohm-reject-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Reject {{ sample.code }}?</h2>
    <mat-dialog-content>
      <p>The client is e-mailed the reason and the reserved credit is returned. This cannot be undone.</p>
      <mat-form-field class="reason">
        <mat-label>Reason (the client reads this)</mat-label>
        <textarea matInput rows="3" [formControl]="reason" cdkFocusInitial></textarea>
        @if (error()) {
          <mat-error>{{ error() }}</mat-error>
        } @else if (reason.touched && reason.invalid) {
          <mat-error>Say why in at least 5 characters.</mat-error>
        }
      </mat-form-field>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button mat-flat-button type="button" class="destructive" [disabled]="reason.invalid || saving()" (click)="reject()">Reject sample</button>
    </mat-dialog-actions>
  `,
  styles: `
    .reason { width: 100%; }
    .destructive { --mat-button-filled-container-color: var(--mat-sys-error); --mat-button-filled-label-text-color: var(--mat-sys-on-error); }
  `,
})
export class RejectDialog {
  protected readonly sample = inject<SampleDetail>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<RejectDialog, SampleDetail>);
  private readonly data = inject(IntakeData);
  protected readonly reason = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.minLength(5), Validators.maxLength(2000)] });
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);

  protected reject(): void {
    this.saving.set(true);
    this.data.reject(this.sample.id, { reason: this.reason.value }).subscribe({
      next: (updated) => this.ref.close(updated),
      error: (e: unknown) => {
        this.saving.set(false);
        const p = ApiProblem.from(e);
        this.error.set(p.fieldErrors.find((f) => f.field === 'reason')?.message ?? p.summary);
      },
    });
  }
}
