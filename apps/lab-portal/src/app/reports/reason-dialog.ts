import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { fieldInWords, type ReportDetail, type ReportSummary } from '@ohmprint/contracts';
import { ApiProblem } from '@ohmprint/ui';
import { ReportsData } from './reports-data';

export interface ReasonDialogData {
  readonly report: ReportSummary;
  readonly action: 'amend' | 'revoke';
}

/**
 * Amending issues a new revision that names the one it replaces (ISO/IEC 17025 7.8.8); revoking
 * marks the report revoked on the public page. Both need a reason.
 */
@Component({
  selector: 'ohm-report-reason-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>{{ d.action === 'amend' ? 'Amend' : 'Revoke' }} report {{ d.report.number }}?</h2>
    <mat-dialog-content>
      @if (d.action === 'amend') {
        <p>A new revision is issued and signed; this one then reads as superseded. Results come from the approved analysis; here you correct the remarks.</p>
        <mat-form-field class="full">
          <mat-label>Remarks (the current ones, to correct)</mat-label>
          <textarea matInput rows="3" [formControl]="remarks"></textarea>
        </mat-form-field>
      } @else {
        <p>The report will show as revoked to anyone who verifies it. This cannot be undone.</p>
      }
      <mat-form-field class="full">
        <mat-label>Reason (printed and shown on verification)</mat-label>
        <textarea matInput rows="2" [formControl]="reason" cdkFocusInitial></textarea>
        @if (error()) {
          <mat-error>{{ error() }}</mat-error>
        }
      </mat-form-field>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button mat-flat-button type="button" [class.destructive]="d.action === 'revoke'" [disabled]="reason.invalid || saving() || !remarksReady()" (click)="confirm()">
        {{ d.action === 'amend' ? 'Issue amendment' : 'Revoke report' }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .full { width: 100%; }
    .destructive { --mat-button-filled-container-color: var(--mat-sys-error); --mat-button-filled-label-text-color: var(--mat-sys-on-error); }
  `,
})
export class ReasonDialog {
  protected readonly d = inject<ReasonDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<ReasonDialog, ReportDetail>);
  private readonly data = inject(ReportsData);
  protected readonly reason = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.minLength(5), Validators.maxLength(1000)] });
  protected readonly remarks = new FormControl('', { nonNullable: true });
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);

  /** False while an amendment's current remarks load, so an empty box is never sent by mistake. */
  protected readonly remarksReady = signal(this.d.action !== 'amend');

  constructor() {
    // An amendment corrects the remarks in print: start from them, not from an empty box.
    if (this.d.action === 'amend') {
      this.remarks.disable();
      this.data.get(this.d.report.id).subscribe({
        next: (detail) => {
          this.remarks.setValue(detail.remarks ?? '');
          this.remarks.enable();
          this.remarksReady.set(true);
        },
        error: () => {
          this.remarks.enable();
          this.error.set('The current remarks could not be loaded; close and try again.');
        },
      });
    }
  }

  protected confirm(): void {
    this.saving.set(true);
    const call =
      this.d.action === 'amend'
        ? this.data.amend(this.d.report.id, { reason: this.reason.value, corrections: { remarks: this.remarks.value } })
        : this.data.revoke(this.d.report.id, this.reason.value);
    call.subscribe({
      next: (r) => this.ref.close(r),
      error: (e: unknown) => {
        this.saving.set(false);
        const p = ApiProblem.from(e);
        this.error.set(p.fieldErrors.map((f) => `${fieldInWords(f.field)}: ${f.message}`).join('; ') || p.summary);
      },
    });
  }
}
