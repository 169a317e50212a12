import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MATRICES, MATRIX_LABELS, type Matrix, type ProductSummary } from '@ohmprint/contracts';
import { FormSubmission, Notice } from '@ohmprint/ui';
import { ProductsData } from './products-data';

const PHOTO_MAX_BYTES = 5 * 1048576;

/** Register a product or edit one (data: the product), with an optional label photo. */
@Component({
  selector: 'ohm-product-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatIconModule, MatProgressBarModule, Notice],
  template: `
    <h2 mat-dialog-title>{{ product ? 'Edit ' + product.name : 'Register a product' }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">A product is what you sell under one name and recipe. The lab builds one reference library per product from lots you send.</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" maxlength="120" cdkFocusInitial />
          @if (form.controls.name.hasError('required')) { <mat-error>Give the product its name as on the label.</mat-error> }
          @if (form.controls.name.hasError('server')) { <mat-error>{{ form.controls.name.getError('server') }}</mat-error> }
        </mat-form-field>
        <mat-form-field>
          <mat-label>Matrix (kind of liquid)</mat-label>
          <mat-select formControlName="matrix">
            @for (m of matrices; track m) { <mat-option [value]="m">{{ labels[m] }}</mat-option> }
          </mat-select>
          <mat-hint>The lab's method and temperature correction depend on it.</mat-hint>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Description (optional)</mat-label>
          <textarea matInput formControlName="description" rows="3" maxlength="2000"></textarea>
          <mat-hint>Variety, style, pack size: whatever tells it apart from your other products.</mat-hint>
        </mat-form-field>
        <div class="photo">
          <input #file type="file" accept="image/png,image/jpeg" hidden (change)="pick(file.files)" />
          <button mat-stroked-button type="button" (click)="file.click()"><mat-icon>add_photo_alternate</mat-icon>{{ photo() ? 'Choose another photo' : 'Add a label photo' }}</button>
          <span class="ohm-muted">{{ photo()?.name ?? (product?.hasPhoto ? 'A photo is stored; choose one to replace it.' : 'Optional. PNG or JPEG, up to 5 MB.') }}</span>
        </div>
        @if (photoError(); as e) { <p class="error" role="alert">{{ e }}</p> }
        @if (saving()) { <mat-progress-bar mode="indeterminate" aria-label="Saving the product" /> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">{{ product ? 'Save changes' : 'Register product' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .photo { display: flex; flex-wrap: wrap; gap: 8px 12px; align-items: center; margin-top: 8px; }
    .error { color: var(--mat-sys-error); margin: 4px 0 0; }
  `,
})
export class ProductDialog {
  private readonly data = inject(ProductsData);
  private readonly dialogRef = inject<MatDialogRef<ProductDialog, ProductSummary>>(MatDialogRef);
  protected readonly product = inject<ProductSummary | null>(MAT_DIALOG_DATA, { optional: true });
  protected readonly matrices = MATRICES;
  protected readonly labels = MATRIX_LABELS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.product?.name ?? '', [Validators.required, Validators.maxLength(120)]],
    matrix: [(this.product?.matrix ?? 'wine') as Matrix, Validators.required],
    description: [this.product?.description ?? '', Validators.maxLength(2000)],
  });
  protected readonly photo = signal<File | null>(null);
  protected readonly photoError = signal<string | null>(null);
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected pick(files: FileList | null): void {
    const file = files?.[0] ?? null;
    this.photoError.set(null);
    if (file && !['image/png', 'image/jpeg'].includes(file.type)) {
      this.photoError.set(`${file.name} is not a PNG or JPEG image.`);
      return;
    }
    if (file && file.size > PHOTO_MAX_BYTES) {
      this.photoError.set(`${file.name} is larger than 5 MB.`);
      return;
    }
    this.photo.set(file);
  }

  protected save(): void {
    this.submission.submit(
      () => this.data.save(this.product?.id ?? null, this.form.getRawValue(), this.photo()),
      (saved) => this.dialogRef.close(saved),
    );
  }
}
