import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MATRIX_LABELS, MATRICES, METHOD_SETTING_LABELS, fieldInWords, THRESHOLD_ESTIMATOR_LABELS, methodSettingText, type MethodItem, type MethodSettings, type MethodVersionDetail, type ModelPreview } from '@ohmprint/contracts';
import { ApiProblem, NyquistChart, Notifier, Session, type SpectrumSeries } from '@ohmprint/ui';
import { LibrariesData } from './libraries-data';

type NumberKey = Exclude<keyof MethodSettings, 'model' | 'thresholdEstimator'>;
const NUMBER_FIELDS: NumberKey[] = [
  'bandMinHz', 'bandMaxHz', 'subBandMinHz', 'subBandMaxHz', 'gridPoints', 'referenceTemperatureC', 'temperatureCoefficientPerC', 'minimumReplicates',
  'replicateDistanceLimit', 'kkResidualLimitPercent', 'temperatureMismatchLimitC', 'lowerQuantile', 'upperQuantile', 'maxThresholdIntervalWidth', 'minimumLots',
];
const OPTIONAL: NumberKey[] = ['subBandMinHz', 'subBandMaxHz', 'maxThresholdIntervalWidth'];

/** Lab admins define methods and change them as new versions; everyone sees what differs. */
@Component({
  selector: 'ohm-methods-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, NyquistChart],
  styles: `
    .layout { display: grid; grid-template-columns: minmax(16rem, 22rem) 1fr; gap: 1.5rem; align-items: start; }
    .methods button { display: block; width: 100%; text-align: left; }
    .method { margin-bottom: 1rem; }
    .method h2 { font: var(--mat-sys-title-medium); margin: 0 0 .25rem; }
    .grid { display: grid; grid-template-columns: repeat(auto-fill, minmax(13rem, 1fr)); gap: 0 1rem; }
    table.settings { border-collapse: collapse; width: 100%; }
    table.settings th, table.settings td { text-align: left; padding: .25rem .5rem; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .changed { font-weight: 600; }
    .lock { display: flex; gap: .5rem; align-items: center; color: var(--mat-sys-on-surface-variant); }
    section { margin-bottom: 1.5rem; }
    @media (max-width: 900px) { .layout { grid-template-columns: 1fr; } }
  `,
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Methods</h1>
        <p>How spectra become a verdict, per matrix. A change is saved as a new version; a version that a published library or an issued report relies on never changes.</p>
      </div>
    </header>
    <div class="layout">
      <nav class="methods" aria-label="Methods and their versions">
        @for (m of methods(); track m.id) {
          <div class="method">
            <h2>{{ m.name }} <small>({{ matrixLabel[m.matrix] }})</small></h2>
            @for (v of m.versions; track v.id) {
              <button mat-button type="button" (click)="open(v.id)" [attr.aria-current]="selected()?.id === v.id ? 'true' : null">
                <mat-icon aria-hidden="true">{{ v.locked ? 'lock' : 'edit_note' }}</mat-icon>Version {{ v.version }} · {{ v.createdAt | date: 'd MMM y' }}
              </button>
            }
          </div>
        } @empty {
          <p>No methods yet. A lab admin defines the first one here.</p>
        }
        @if (isAdmin()) {
          <button mat-stroked-button type="button" (click)="startNew()"><mat-icon>add</mat-icon>New method</button>
        }
      </nav>
      <div>
        @if (selected(); as v) {
          <section aria-labelledby="version-heading">
            <h2 id="version-heading">{{ v.name }}, version {{ v.version }}</h2>
            <p class="lock">
              <mat-icon aria-hidden="true">{{ v.locked ? 'lock' : 'lock_open' }}</mat-icon>
              {{ v.locked ? 'Locked: ' + v.lockReason : 'Nothing relies on this version yet.' }}
            </p>
            @if (v.note) { <p>{{ v.note }}</p> }
            @if (v.previousVersion !== null) {
              <h3>What differs from version {{ v.previousVersion }}</h3>
              @if (v.differences.length) {
                <table class="settings" aria-label="Differences from the previous version">
                  <thead><tr><th scope="col">Setting</th><th scope="col">Version {{ v.previousVersion }}</th><th scope="col">Version {{ v.version }}</th></tr></thead>
                  <tbody>
                    @for (d of v.differences; track d.field) { <tr><th scope="row">{{ d.label }}</th><td>{{ d.before ?? '—' }}</td><td class="changed">{{ d.after ?? '—' }}</td></tr> }
                  </tbody>
                </table>
              } @else { <p>No setting differs.</p> }
            }
            <h3>Settings</h3>
            <table class="settings" aria-label="Settings of this version">
              <tbody>
                @for (row of settingRows(); track row.label) { <tr><th scope="row">{{ row.label }}</th><td>{{ row.value }}</td></tr> }
              </tbody>
            </table>
            @if (isAdmin()) {
              <p><button mat-stroked-button type="button" (click)="edit(v)"><mat-icon>difference</mat-icon>Change as a new version</button></p>
            }
          </section>
        }
        @if (editing()) {
          <section aria-labelledby="form-heading">
            <h2 id="form-heading">{{ basedOn() ? 'New version of ' + basedOn()!.name : 'New method' }}</h2>
            <form [formGroup]="form" (ngSubmit)="save()">
              @if (!basedOn()) {
                <div class="grid">
                  <mat-form-field><mat-label>Name</mat-label><input matInput formControlName="name" /></mat-form-field>
                  <mat-form-field><mat-label>Matrix</mat-label>
                    <mat-select formControlName="matrix">@for (x of matrices; track x) { <mat-option [value]="x">{{ matrixLabel[x] }}</mat-option> }</mat-select>
                  </mat-form-field>
                </div>
              }
              <div class="grid">
                @for (f of numberFields; track f) {
                  <mat-form-field><mat-label>{{ labels[f] }}</mat-label><input matInput type="number" step="any" [formControlName]="f" /></mat-form-field>
                }
                <mat-form-field><mat-label>Model</mat-label>
                  <mat-select formControlName="modelChoice">
                    @for (m of catalog(); track m.name) { <mat-option [value]="m.name">{{ m.label }}</mat-option> }
                    <mat-option value="expression">A lab expression…</mat-option>
                  </mat-select>
                </mat-form-field>
                @if (form.controls.modelChoice.value === 'expression') {
                  <mat-form-field><mat-label>Expression in ω and j</mat-label><input matInput formControlName="expression" placeholder="Rs + R / (1 + (j*omega*tau)^a)" /></mat-form-field>
                }
                <mat-form-field><mat-label>Threshold estimator</mat-label>
                  <mat-select formControlName="thresholdEstimator">
                    @for (e of estimators; track e[0]) { <mat-option [value]="e[0]">{{ e[1] }}</mat-option> }
                  </mat-select>
                </mat-form-field>
                <mat-form-field><mat-label>Note</mat-label><input matInput formControlName="note" /></mat-form-field>
              </div>
              @if (error()) { <p role="alert" class="ohm-error">{{ error() }}</p> }
              <p>
                <button mat-flat-button type="submit" [disabled]="saving()"><mat-icon>save</mat-icon>Save version</button>
                <button mat-button type="button" (click)="editing.set(false)">Cancel</button>
              </p>
            </form>
            <h3>Try the model on a real spectrum</h3>
            <div class="grid">
              <mat-form-field><mat-label>Spectrum</mat-label>
                <mat-select [value]="previewReplicate()" (selectionChange)="previewReplicate.set($event.value)">
                  @for (r of replicates(); track r.replicateId) { <mat-option [value]="r.replicateId">{{ r.sampleCode }} · replicate {{ r.replicateNumber }}</mat-option> }
                </mat-select>
              </mat-form-field>
            </div>
            <button mat-stroked-button type="button" [disabled]="!previewReplicate()" (click)="runPreview()"><mat-icon>insights</mat-icon>Preview the fit</button>
            @if (preview(); as p) {
              <p>{{ p.modelLabel }} on {{ p.sampleCode }}: {{ p.converged ? 'converged, χ² = ' + p.chiSquare?.toPrecision(3) : 'did not converge (' + p.reason + ')' }}</p>
              <ohm-nyquist-chart [series]="previewSeries()" [unit]="p.impedanceUnit" heading="Model fitted over the measured spectrum" />
            }
          </section>
        }
      </div>
    </div>
  `,
})
export class MethodsPage {
  protected readonly matrixLabel = MATRIX_LABELS;
  private readonly data = inject(LibrariesData);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  protected readonly labels = METHOD_SETTING_LABELS;
  protected readonly numberFields = NUMBER_FIELDS;
  protected readonly matrices = MATRICES;
  protected readonly estimators = Object.entries(THRESHOLD_ESTIMATOR_LABELS);
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['lab-admin']));
  protected readonly methods = signal<MethodItem[]>([]);
  protected readonly selected = signal<MethodVersionDetail | null>(null);
  protected readonly editing = signal(false);
  protected readonly basedOn = signal<MethodVersionDetail | null>(null);
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly catalog = toSignal(this.data.catalog(), { initialValue: [] });
  protected readonly replicates = signal<{ replicateId: string; sampleCode: string; replicateNumber: number }[]>([]);
  protected readonly previewReplicate = signal<string | null>(null);
  protected readonly preview = signal<ModelPreview | null>(null);
  protected readonly previewSeries = computed((): SpectrumSeries[] => {
    const p = this.preview();
    if (!p) return [];
    const measured = { label: `Measured (${p.sampleCode})`, frequencyHz: p.frequencyHz, re: p.measured.re, im: p.measured.im };
    return p.fitted ? [measured, { label: `Fitted ${p.modelLabel}`, frequencyHz: p.frequencyHz, re: p.fitted.re, im: p.fitted.im }] : [measured];
  });
  protected readonly settingRows = computed(() => {
    const v = this.selected();
    if (!v) return [];
    return (Object.keys(METHOD_SETTING_LABELS) as (keyof MethodSettings)[]).map((f) => ({ label: METHOD_SETTING_LABELS[f], value: methodSettingText(f, v.settings[f]) ?? '—' }));
  });

  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true }),
    matrix: new FormControl('wine', { nonNullable: true }),
    modelChoice: new FormControl('cole-cole', { nonNullable: true }),
    expression: new FormControl('', { nonNullable: true }),
    thresholdEstimator: new FormControl('lognormal-ml', { nonNullable: true }),
    note: new FormControl('', { nonNullable: true }),
    ...Object.fromEntries(NUMBER_FIELDS.map((f) => [f, new FormControl<number | null>(null, OPTIONAL.includes(f) ? [] : [Validators.required])])),
  } as Record<string, FormControl>) as FormGroup & { controls: Record<string, FormControl> };

  constructor() {
    this.reload();
    if (this.session.hasAnyRole(['lab-admin', 'analyst'])) this.data.previewReplicates().subscribe((r) => this.replicates.set(r));
  }

  private reload(): void {
    this.data.methods().subscribe((page) => this.methods.set(page.items));
  }

  protected open(id: string): void {
    this.data.methodVersion(id).subscribe((v) => this.selected.set(v));
  }

  protected startNew(): void {
    this.basedOn.set(null);
    this.fill({
      bandMinHz: 100, bandMaxHz: 500000, gridPoints: 41, referenceTemperatureC: 20, temperatureCoefficientPerC: 0.02, lowerQuantile: 0.95, upperQuantile: 0.99,
      minimumLots: 5, minimumReplicates: 2, model: 'cole-cole', kkResidualLimitPercent: 2, replicateDistanceLimit: 0.01, temperatureMismatchLimitC: 0.5, thresholdEstimator: 'lognormal-ml', maxThresholdIntervalWidth: 1,
    });
    this.editing.set(true);
  }

  protected edit(v: MethodVersionDetail): void {
    this.basedOn.set(v);
    this.fill(v.settings);
    this.editing.set(true);
  }

  private fill(s: MethodSettings): void {
    const builtin = this.catalog().some((m) => m.name === s.model);
    this.form.patchValue({ ...s, modelChoice: builtin ? s.model : 'expression', expression: builtin ? '' : s.model, thresholdEstimator: s.thresholdEstimator ?? 'empirical-type7', note: '' });
  }

  private settings(): MethodSettings {
    const v = this.form.getRawValue() as Record<string, unknown>;
    const out: Record<string, unknown> = { model: v['modelChoice'] === 'expression' ? v['expression'] : v['modelChoice'], thresholdEstimator: v['thresholdEstimator'] };
    for (const f of NUMBER_FIELDS) {
      const x = v[f];
      if (x === null || x === '' || x === undefined) {
        if (!OPTIONAL.includes(f)) out[f] = NaN;
      } else out[f] = Number(x);
    }
    return out as MethodSettings;
  }

  protected save(): void {
    const v = this.form.getRawValue() as Record<string, string>;
    const base = this.basedOn();
    this.saving.set(true);
    this.error.set(null);
    const request = base ? this.data.addVersion(base.methodId, this.settings(), v['note']) : this.data.createMethod({ name: v['name'], matrix: v['matrix'] as MethodItem['matrix'], settings: this.settings(), note: v['note'] });
    request.subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.editing.set(false);
        this.selected.set(saved);
        this.notifier.success(`${saved.name}: version ${saved.version} saved.`);
        this.reload();
      },
      error: (e: unknown) => {
        this.saving.set(false);
        const p = e instanceof ApiProblem ? e : null;
        this.error.set(p ? [p.detail, ...p.fieldErrors.map((x) => `${fieldInWords(x.field)}: ${x.message}`)].filter(Boolean).join(' ') : 'The method could not be saved.');
      },
    });
  }

  protected runPreview(): void {
    const id = this.previewReplicate();
    if (!id) return;
    this.data.preview(id, this.settings()).subscribe({
      next: (p) => this.preview.set(p),
      error: (e: unknown) => this.error.set(e instanceof ApiProblem ? (e.detail ?? e.title) : 'The preview failed.'),
    });
  }
}
