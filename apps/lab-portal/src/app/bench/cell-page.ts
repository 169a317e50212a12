import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { ControlChartView } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier, Session } from '@ohmprint/ui';
import { ValidationFiles } from '../validation/validation-files';
import { BenchData } from './bench-data';
import { ControlChart } from './control-chart';
import { ControlStatusChip } from './control-status';

/** KCl standards on offer: the tabulated ones (the API holds their values and sources). */
const STANDARDS = [
  { label: 'KCl 0.01 mol/kg (molal)', concentration: 0.01, basis: 'molal' },
  { label: 'KCl 0.1 mol/kg (molal)', concentration: 0.1, basis: 'molal' },
  { label: 'KCl 1.0 mol/kg (molal)', concentration: 1, basis: 'molal' },
  { label: 'KCl 0.01 mol/L (molar)', concentration: 0.01, basis: 'molar' },
  { label: 'KCl 0.1 mol/L (molar)', concentration: 0.1, basis: 'molar' },
] as const;

/** One cell: its control chart, its standard runs, and a form to record a new run. */
@Component({
  selector: 'ohm-cell-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MatTableModule, Notice, ControlChart, ControlStatusChip],
  template: `
    @if (chart(); as c) {
      <header class="ohm-page-header">
        <div>
          <p class="crumb"><a routerLink="/bench">Instruments and cells</a></p>
          <h1>{{ c.cell.name }} <ohm-control-status [status]="c.status" /></h1>
          <p>Nominal constant {{ c.cell.nominalConstantPerCm }} cm⁻¹.
            @if (c.centre !== null) { Centre {{ c.centre | number: '1.4-4' }}, limits {{ c.lowerLimit | number: '1.4-4' }}–{{ c.upperLimit | number: '1.4-4' }} cm⁻¹. }</p>
        </div>
        <button mat-stroked-button type="button" (click)="files.download('/api/lab/cells/' + c.cell.id + '/standard-runs.csv', 'standard-runs-' + c.cell.name + '.csv')"><mat-icon>download</mat-icon>Runs (CSV)</button>
      </header>
      <ohm-notice [tone]="c.status.state === 'out-of-control' ? 'error' : 'info'" [icon]="c.status.state === 'out-of-control' ? 'block' : 'info'"><p>{{ c.status.message }}</p></ohm-notice>
      <section class="chart-card">
        <ohm-control-chart [chart]="c" />
        <details>
          <summary>How the limits and rules work</summary>
          <p>{{ c.baselineRule }}</p>
          <p>Ohmprint's run rules (common practice for control charts):</p>
          <ul>@for (r of c.rules; track r.rule) { <li>{{ r.description }}</li> }</ul>
          <p>After a run breaks a rule the counting starts again, so one new standard run inside the limits releases the cell.</p>
        </details>
      </section>

      @if (canRecord) {
        <form class="record" [formGroup]="form" (ngSubmit)="record(c.cell.id)" aria-label="Record a KCl standard run">
          <h2>Record a KCl standard run</h2>
          <p class="ohm-muted">The standard's conductivity at the run's temperature comes from the CRC Handbook table of KCl standards (Wu, Koch &amp; Pratt 1991; molal) or the values printed on commercial standards (molar), referred by linear compensation at 2 %/°C. Give the certificate's value at 25 °C to use it instead.</p>
          <div class="fields">
            <mat-form-field>
              <mat-label>Standard</mat-label>
              <mat-select formControlName="standard" required>
                @for (s of standards; track s.label; let i = $index) { <mat-option [value]="i">{{ s.label }}</mat-option> }
              </mat-select>
            </mat-form-field>
            <mat-form-field>
              <mat-label>Temperature of the standard</mat-label>
              <input matInput type="number" step="0.1" formControlName="temperatureC" required /><span matTextSuffix>°C</span>
            </mat-form-field>
            <mat-form-field>
              <mat-label>Certificate κ at 25 °C (optional)</mat-label>
              <input matInput type="number" step="0.01" formControlName="certified" /><span matTextSuffix>µS/cm</span>
            </mat-form-field>
          </div>
          <label class="file">
            <mat-icon aria-hidden="true">upload_file</mat-icon>
            <span>{{ file()?.name ?? 'Choose the standard’s spectrum (instrument export)' }}</span>
            <input type="file" accept=".csv,.txt,.tsv,.dat,text/plain,text/csv" (change)="picked($event)" />
          </label>
          @if (error()) { <p class="error" role="alert">{{ error() }}</p> }
          <button mat-flat-button type="submit" [disabled]="form.invalid || !file() || saving()"><mat-icon>science</mat-icon>Record run</button>
        </form>
      }

      <h2>Standard runs</h2>
      <div class="ohm-table-card">
        <table mat-table [dataSource]="runsNewestFirst()" aria-label="Standard runs, newest first">
          <ng-container matColumnDef="at"><th mat-header-cell *matHeaderCellDef>Measured</th><td mat-cell *matCellDef="let r">{{ r.measuredAt | date: 'd MMM y, HH:mm' }}</td></ng-container>
          <ng-container matColumnDef="standard"><th mat-header-cell *matHeaderCellDef>Standard</th><td mat-cell *matCellDef="let r">{{ r.standardName }} at {{ r.temperatureC }} °C</td></ng-container>
          <ng-container matColumnDef="kappa"><th mat-header-cell *matHeaderCellDef>κ</th><td mat-cell *matCellDef="let r" [title]="r.conductivitySource ?? ''">{{ r.standardConductivityUsPerCm | number: '1.1-1' }} µS/cm</td></ng-container>
          <ng-container matColumnDef="r"><th mat-header-cell *matHeaderCellDef>R</th><td mat-cell *matCellDef="let r">{{ r.plateauResistanceOhm | number: '1.2-2' }} Ω ({{ r.resistanceSource }})</td></ng-container>
          <ng-container matColumnDef="k"><th mat-header-cell *matHeaderCellDef>K</th><td mat-cell *matCellDef="let r">{{ r.cellConstantPerCm | number: '1.5-5' }} cm⁻¹</td></ng-container>
          <ng-container matColumnDef="rules"><th mat-header-cell *matHeaderCellDef>Rules</th>
            <td mat-cell *matCellDef="let r">
              @if (r.signals.length) { <span class="broke"><mat-icon aria-hidden="true">close</mat-icon>{{ ruleText(r.signals) }}</span> } @else { {{ r.inBaseline ? 'Baseline' : 'Within rules' }} }
            </td></ng-container>
          <ng-container matColumnDef="by"><th mat-header-cell *matHeaderCellDef>By</th><td mat-cell *matCellDef="let r">{{ r.measuredBy.displayName }}</td></ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
      </div>
      @if (c.refusals.length) {
        <h2>Measurements refused on this cell</h2>
        <ul class="refusals">@for (x of c.refusals; track x.at + x.sampleCode) { <li>{{ x.at | date: 'd MMM y, HH:mm' }} · {{ x.sampleCode }} · {{ ruleWords(c.rules, x.rule) }}</li> }</ul>
      }
    }
  `,
  styles: `
    h1 { display: flex; gap: 12px; align-items: center; flex-wrap: wrap; }
    h2 { font: var(--mat-sys-title-medium); margin: 20px 0 8px; }
    .crumb { margin: 0; }
    .chart-card { margin: 12px 0; padding: 12px 16px; border-radius: var(--mat-sys-corner-medium); background: var(--mat-sys-surface-container-low); }
    details { margin-top: 8px; font: var(--mat-sys-body-medium); }
    .record { margin: 16px 0; }
    .fields { display: grid; grid-template-columns: repeat(auto-fill, minmax(240px, 1fr)); gap: 0 12px; }
    .file { display: inline-flex; gap: 8px; align-items: center; padding: 8px 12px; margin: 0 12px 12px 0; border: 1px dashed var(--mat-sys-outline); border-radius: var(--mat-sys-corner-small); cursor: pointer; }
    .file input { position: absolute; opacity: 0; width: 1px; height: 1px; }
    .file:focus-within { outline: 2px solid var(--mat-sys-primary); }
    .error { color: var(--mat-sys-error); }
    .broke { display: inline-flex; gap: 4px; align-items: center; color: var(--mat-sys-error); }
    .broke mat-icon { width: 18px; height: 18px; font-size: 18px; }
    .refusals { font: var(--mat-sys-body-medium); }
  `,
})
export class CellPage {
  private readonly data = inject(BenchData);
  private readonly notifier = inject(Notifier);
  protected readonly files = inject(ValidationFiles);
  readonly id = input.required<string>();
  protected readonly canRecord = inject(Session).hasAnyRole(['analyst', 'lab-admin']);
  protected readonly standards = STANDARDS;
  protected readonly columns = ['at', 'standard', 'kappa', 'r', 'k', 'rules', 'by'];
  protected readonly chart = signal<ControlChartView | null>(null);
  protected readonly runsNewestFirst = signal<ControlChartView['runs']>([]);
  protected readonly file = signal<File | null>(null);
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    standard: [0, Validators.required],
    temperatureC: [25, [Validators.required, Validators.min(0), Validators.max(50)]],
    certified: [null as number | null, [Validators.min(0.001)]],
  });
  protected readonly ruleText = (signals: { message: string }[]) => signals.map((s) => s.message).join('; ');
  /** A refusal stores the rule's code; people read the rule's own description. */
  protected readonly ruleWords = (rules: readonly { rule: string; description: string }[], rule: string) => rules.find((r) => r.rule === rule)?.description ?? rule;

  constructor() {
    effect(() => this.load(this.id()));
  }

  protected picked(event: Event): void {
    this.file.set((event.target as HTMLInputElement).files?.[0] ?? null);
  }

  protected record(cellId: string): void {
    const v = this.form.getRawValue();
    const s = STANDARDS[v.standard];
    const file = this.file();
    if (!file) return;
    this.saving.set(true);
    this.error.set(null);
    this.data.recordRun(cellId, { concentration: s.concentration, basis: s.basis, temperatureC: v.temperatureC, certifiedConductivityAt25UsPerCm: v.certified ?? undefined }, file).subscribe({
      next: (c) => {
        this.saving.set(false);
        this.show(c);
        this.file.set(null);
        const last = c.runs[c.runs.length - 1];
        this.notifier.success(`Run recorded: K = ${last.cellConstantPerCm.toFixed(5)} cm⁻¹. ${c.status.state === 'out-of-control' ? 'The cell is out of control.' : ''}`);
      },
      error: (e: unknown) => {
        this.saving.set(false);
        this.error.set(ApiProblem.from(e).summary);
      },
    });
  }

  private load(id: string): void {
    this.data.chart(id).subscribe((c) => this.show(c));
  }

  private show(c: ControlChartView): void {
    this.chart.set(c);
    this.runsNewestFirst.set([...c.runs].reverse());
  }
}
