import { LowerCasePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormArray, FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { IntakeLimit, IntakeLimits, Matrix } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier, Session } from '@ohmprint/ui';
import { IntakeLimitsData } from './intake-limits-data';

const MATRIX_WORDS: Readonly<Record<Matrix, string>> = {
  wine: 'Wine',
  milk: 'Milk',
  juice: 'Fruit juice',
  vinegar: 'Vinegar',
  spirit: 'Spirit',
  brine: 'Brine',
};

/** Per matrix: the arrival temperatures and sample age intake accepts without asking for a reason. */
@Component({
  selector: 'ohm-intake-limits-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LowerCasePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, Notice],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Intake limits</h1>
        <p>
          A sample outside these limits, or with a broken seal or a damaged container, is accepted only with a reason,
          which goes into the audit log and the chain of custody.
        </p>
      </div>
    </header>
    @if (source(); as s) {
      <ohm-notice icon="menu_book">{{ s }}</ohm-notice>
    }
    <form [formGroup]="form" (ngSubmit)="save()">
      <div class="ohm-table-card">
        <table class="limits" aria-label="Intake limits per matrix">
          <thead>
            <tr><th scope="col">Matrix</th><th scope="col">Lowest on arrival</th><th scope="col">Highest on arrival</th><th scope="col">Tested within</th></tr>
          </thead>
          <tbody formArrayName="limits">
            @for (row of rows.controls; track row.value.matrix; let i = $index) {
              <tr [formGroupName]="i">
                <th scope="row">{{ words[row.controls.matrix.value] }}</th>
                <td>
                  <mat-form-field subscriptSizing="dynamic">
                    <mat-label>Lowest, {{ words[row.controls.matrix.value] | lowercase }}</mat-label>
                    <input matInput type="number" step="0.5" formControlName="minArrivalC" />
                    <span matTextSuffix>°C</span>
                  </mat-form-field>
                </td>
                <td>
                  <mat-form-field subscriptSizing="dynamic">
                    <mat-label>Highest, {{ words[row.controls.matrix.value] | lowercase }}</mat-label>
                    <input matInput type="number" step="0.5" formControlName="maxArrivalC" />
                    <span matTextSuffix>°C</span>
                    @if (row.controls.maxArrivalC.hasError('server')) { <mat-error>{{ row.controls.maxArrivalC.getError('server') }}</mat-error> }
                  </mat-form-field>
                </td>
                <td>
                  <mat-form-field subscriptSizing="dynamic">
                    <mat-label>Days, {{ words[row.controls.matrix.value] | lowercase }}</mat-label>
                    <input matInput type="number" step="1" formControlName="maxAgeDays" />
                    <span matTextSuffix>days</span>
                  </mat-form-field>
                </td>
              </tr>
            }
          </tbody>
        </table>
      </div>
      @if (canEdit) {
        <div class="buttons">
          <button mat-flat-button type="submit" [disabled]="form.invalid || saving()"><mat-icon>save</mat-icon>Save the lab's limits</button>
        </div>
      } @else {
        <p class="ohm-muted">A lab admin can change these limits.</p>
      }
    </form>
  `,
  styles: `
    .limits { width: 100%; border-collapse: collapse; }
    .limits th, .limits td { padding: 6px 12px; text-align: left; }
    .limits thead th { font: var(--mat-sys-title-small); color: var(--mat-sys-on-surface-variant); }
    .limits tbody th { font: var(--mat-sys-body-large); }
    .limits mat-form-field { width: 150px; }
    .buttons { margin-top: 16px; }
  `,
})
export class IntakeLimitsPage {
  private readonly data = inject(IntakeLimitsData);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(FormBuilder).nonNullable;

  protected readonly words = MATRIX_WORDS;
  protected readonly canEdit = inject(Session).hasAnyRole(['lab-admin']);
  protected readonly source = signal<string | null>(null);
  protected readonly saving = signal(false);
  protected readonly rows = this.fb.array<ReturnType<IntakeLimitsPage['row']>>([]);
  protected readonly form = this.fb.group({ limits: this.rows as FormArray });

  constructor() {
    this.data.load().subscribe((limits) => this.show(limits));
  }

  protected save(): void {
    if (this.form.invalid) return;
    this.saving.set(true);
    this.data.save({ limits: this.rows.getRawValue() }).subscribe({
      next: (limits) => {
        this.saving.set(false);
        this.show(limits);
        this.notifier.success('The lab’s intake limits are saved; intake uses them from now on.');
      },
      error: (e: unknown) => {
        this.saving.set(false);
        const problem = ApiProblem.from(e);
        for (const err of problem.fieldErrors) {
          const m = err.field.match(/^limits\.(\d+)\.(\w+)$/);
          const control = m ? this.rows.at(Number(m[1]))?.get(m[2]) : null;
          control?.setErrors({ server: err.message });
          control?.markAsTouched();
        }
        this.notifier.problem(problem);
      },
    });
  }

  private row(limit: IntakeLimit) {
    const number = [Validators.required, Validators.min(-40), Validators.max(80)];
    return this.fb.group({
      matrix: this.fb.control<Matrix>(limit.matrix),
      minArrivalC: [limit.minArrivalC, number],
      maxArrivalC: [limit.maxArrivalC, number],
      maxAgeDays: [limit.maxAgeDays, [Validators.required, Validators.min(1), Validators.max(36500)]],
    });
  }

  private show(limits: IntakeLimits): void {
    this.source.set(limits.source);
    this.rows.clear();
    for (const l of limits.limits) this.rows.push(this.row(l));
    if (!this.canEdit) this.form.disable();
  }
}
