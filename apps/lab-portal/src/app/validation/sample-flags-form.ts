import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, output, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ValidationFlagsSchema, type ValidationFlags } from '@ohmprint/contracts';
import { ApiProblem, Notifier, quietRequest } from '@ohmprint/ui';
import { map, switchMap } from 'rxjs';
import { z } from 'zod';

const SampleRefSchema = z.object({ id: z.uuid(), code: z.string() });

/** Marks a sample (by its code) as a blind check of an authentic lot, or as a deliberate mixture. */
@Component({
  selector: 'ohm-sample-flags-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule],
  template: `
    <form [formGroup]="form" (ngSubmit)="save()" aria-label="Mark a sample for validation">
      <h3>Mark a sample</h3>
      <div class="fields">
        <mat-form-field><mat-label>Sample code</mat-label><input matInput formControlName="code" placeholder="OP-XXXX-XX" required /></mat-form-field>
        <mat-checkbox formControlName="blindCheck">Blind check: an authentic reference lot sent as a routine sample</mat-checkbox>
        <mat-checkbox formControlName="isMixture">Deliberate mixture for the detection study</mat-checkbox>
        @if (form.controls.isMixture.value) {
          <mat-form-field><mat-label>Added</mat-label>
            <mat-select formControlName="admixture"><mat-option value="water">Water</mat-option><mat-option value="other-product">Another product</mat-option></mat-select></mat-form-field>
          <mat-form-field><mat-label>What was added</mat-label><input matInput formControlName="admixtureName" placeholder="tap water" /></mat-form-field>
          <mat-form-field><mat-label>Level</mat-label><input matInput type="number" step="0.5" formControlName="levelPercent" /><span matTextSuffix>% by volume</span></mat-form-field>
        }
      </div>
      @if (error()) { <p class="error" role="alert">{{ error() }}</p> }
      <button mat-stroked-button type="submit" [disabled]="form.invalid || saving()"><mat-icon>flag</mat-icon>Save marks</button>
    </form>
  `,
  styles: `
    h3 { font: var(--mat-sys-title-small); margin: 16px 0 8px; }
    .fields { display: flex; flex-wrap: wrap; gap: 4px 16px; align-items: center; }
    .error { color: var(--mat-sys-error); }
  `,
})
export class SampleFlagsForm {
  private readonly http = inject(HttpClient);
  private readonly notifier = inject(Notifier);
  readonly saved = output<ValidationFlags>();
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    code: ['', [Validators.required, Validators.maxLength(20)]],
    blindCheck: [false],
    isMixture: [false],
    admixture: ['water' as 'water' | 'other-product'],
    admixtureName: ['tap water', Validators.maxLength(120)],
    levelPercent: [10, [Validators.min(0.1), Validators.max(100)]],
  });

  protected save(): void {
    const v = this.form.getRawValue();
    const flags: ValidationFlags = { blindCheck: v.blindCheck, mixture: v.isMixture ? { admixture: v.admixture, admixtureName: v.admixtureName.trim() || v.admixture, levelPercent: v.levelPercent } : null };
    this.saving.set(true);
    this.error.set(null);
    this.http
      .get(`/api/lab/samples/by-code/${encodeURIComponent(v.code.trim())}`, { context: quietRequest() })
      .pipe(
        map((r) => SampleRefSchema.parse(r)),
        switchMap((s) => this.http.put(`/api/lab/samples/${s.id}/validation-flags`, flags, { context: quietRequest() }).pipe(map((r) => ({ code: s.code, flags: ValidationFlagsSchema.parse(r) })))),
      )
      .subscribe({
        next: ({ code, flags: f }) => {
          this.saving.set(false);
          this.notifier.success(`${code} marked.`);
          this.saved.emit(f);
        },
        error: (e: unknown) => {
          this.saving.set(false);
          this.error.set(ApiProblem.from(e).summary);
        },
      });
  }
}
