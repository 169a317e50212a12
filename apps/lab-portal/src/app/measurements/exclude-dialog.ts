import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Replicate, SampleMeasurements } from '@ohmprint/contracts';
import { ApiProblem } from '@ohmprint/ui';
import { MeasurementsData } from './measurements-data';

export interface ExcludeRequest {
  readonly sampleId: string;
  readonly replicate: Replicate;
}

/** Excluding keeps the replicate on file (and in the audit log) but out of the analysis. */
@Component({
  selector: 'ohm-exclude-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Exclude replicate {{ replicate.replicateNumber }}?</h2>
    <mat-dialog-content>
      <p>{{ replicate.fileName }} stays on file and in the audit log, but no analysis will use it. The reason is shown to the reviewer.</p>
      <mat-form-field class="reason">
        <mat-label>Reason</mat-label>
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
      <button mat-flat-button type="button" [disabled]="reason.invalid || saving()" (click)="exclude()">Exclude replicate</button>
    </mat-dialog-actions>
  `,
  styles: `.reason { width: 100%; }`,
})
export class ExcludeDialog {
  private readonly request = inject<ExcludeRequest>(MAT_DIALOG_DATA);
  protected readonly replicate = this.request.replicate;
  private readonly ref = inject(MatDialogRef<ExcludeDialog, SampleMeasurements>);
  private readonly data = inject(MeasurementsData);
  protected readonly reason = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.minLength(5), Validators.maxLength(1000)] });
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);

  protected exclude(): void {
    this.saving.set(true);
    this.data.exclude(this.request.sampleId, this.replicate.id, this.reason.value).subscribe({
      next: (updated) => this.ref.close(updated),
      error: (e: unknown) => {
        this.saving.set(false);
        const p = ApiProblem.from(e);
        this.error.set(p.fieldErrors.find((f) => f.field === 'reason')?.message ?? p.summary);
      },
    });
  }
}
