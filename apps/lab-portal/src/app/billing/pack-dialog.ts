import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { CreditPack } from '@ohmprint/contracts';
import { FormSubmission, Notice } from '@ohmprint/ui';
import { BillingData } from './billing-data';

/** Decimal places of a currency (2 for EUR, 0 for JPY), from the browser's own currency data. */
export function currencyDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    return 2;
  }
}

/** New pack, or changes to one (`data` is the pack). A new price retires the old one at the payment service. */
@Component({
  selector: 'ohm-pack-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, Notice],
  template: `
    <h2 mat-dialog-title>{{ pack ? 'Edit ' + pack.name : 'New credit pack' }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        @if (pack) {
          <p class="ohm-muted">Changing the price, currency or credits makes a new price at the payment service and retires the old one. Checkouts already started keep their price.</p>
        }
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" required cdkFocusInitial />
          @if (form.controls.name.hasError('required')) { <mat-error>Enter a name clients will recognise.</mat-error> }
          @else if (form.controls.name.hasError('maxlength')) { <mat-error>Keep it under 80 characters.</mat-error> }
          @else if (form.controls.name.hasError('server')) { <mat-error>Name {{ form.controls.name.getError('server') }}.</mat-error> }
        </mat-form-field>
        <mat-form-field>
          <mat-label>Credits</mat-label>
          <input matInput type="number" formControlName="credits" min="1" max="10000" step="1" required />
          @if (form.controls.credits.invalid) { <mat-error>Enter a whole number from 1 to 10000.</mat-error> }
        </mat-form-field>
        <div class="row">
          <mat-form-field>
            <mat-label>Price</mat-label>
            <input matInput type="number" formControlName="price" min="0" step="0.01" required />
            <mat-hint>In {{ form.controls.currency.value.toUpperCase() || 'the currency' }}, e.g. 420.00</mat-hint>
            @if (form.controls.price.invalid) { <mat-error>Enter a price of 0 or more.</mat-error> }
          </mat-form-field>
          <mat-form-field class="currency">
            <mat-label>Currency</mat-label>
            <input matInput formControlName="currency" required maxlength="3" autocapitalize="characters" />
            <mat-hint>Code such as EUR</mat-hint>
            @if (form.controls.currency.invalid) { <mat-error>Three letters, e.g. EUR.</mat-error> }
          </mat-form-field>
        </div>
        @if (saving()) {
          <mat-progress-bar mode="indeterminate" aria-label="Saving the pack" />
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">{{ pack ? 'Save changes' : 'Put on sale' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `.row { display: flex; gap: 12px; } .row mat-form-field { flex: 1; } .currency { max-width: 140px; }`,
})
export class PackDialog {
  private readonly data = inject(BillingData);
  private readonly dialogRef = inject<MatDialogRef<PackDialog, CreditPack>>(MatDialogRef);
  protected readonly pack = inject<CreditPack | null>(MAT_DIALOG_DATA, { optional: true });
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    name: [this.pack?.name ?? '', [Validators.required, Validators.maxLength(80)]],
    credits: [this.pack?.credits ?? 10, [Validators.required, Validators.min(1), Validators.max(10000), Validators.pattern(/^\d+$/)]],
    price: [this.pack ? this.pack.price / 10 ** currencyDigits(this.pack.currency) : 0, [Validators.required, Validators.min(0)]],
    currency: [(this.pack?.currency ?? 'eur').toUpperCase(), [Validators.required, Validators.pattern(/^[A-Za-z]{3}$/)]],
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected save(): void {
    const v = this.form.getRawValue();
    const body = { name: v.name.trim(), credits: Number(v.credits), price: Math.round(Number(v.price) * 10 ** currencyDigits(v.currency)), currency: v.currency.toLowerCase() };
    this.submission.submit(
      () => (this.pack ? this.data.updatePack(this.pack.id, body) : this.data.createPack(body)),
      (saved) => this.dialogRef.close(saved),
    );
  }
}
