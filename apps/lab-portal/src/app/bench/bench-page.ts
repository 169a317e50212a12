import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { BenchEquipment } from '@ohmprint/contracts';
import { ApiProblem, EmptyState, Notifier, Session } from '@ohmprint/ui';
import { BenchData } from './bench-data';
import { ControlStatusChip } from './control-status';

/** The lab's instruments and cells, each cell with its control state and a way to its chart. */
@Component({
  selector: 'ohm-bench-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatTableModule, EmptyState, ControlStatusChip],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Instruments and cells</h1>
        <p>Each cell's constant is checked against KCl standards; a cell whose newest standard run breaks a control rule takes no measurements until a new run is back in control.</p>
      </div>
    </header>

    <h2>Cells</h2>
    <div class="ohm-table-card">
      <table mat-table [dataSource]="bench().cells" aria-label="Measurement cells">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef>Cell</th>
          <td mat-cell *matCellDef="let c"><a [routerLink]="['cells', c.id]">{{ c.name }}</a></td>
        </ng-container>
        <ng-container matColumnDef="nominal">
          <th mat-header-cell *matHeaderCellDef>Nominal constant</th>
          <td mat-cell *matCellDef="let c">{{ c.nominalConstantPerCm }} cm⁻¹</td>
        </ng-container>
        <ng-container matColumnDef="latest">
          <th mat-header-cell *matHeaderCellDef>Latest standard run</th>
          <td mat-cell *matCellDef="let c">
            @if (c.latestCalibration; as cal) { {{ cal.cellConstantPerCm.toFixed(4) }} cm⁻¹ · {{ cal.measuredAt.slice(0, 10) }} } @else { None yet }
          </td>
        </ng-container>
        <ng-container matColumnDef="state">
          <th mat-header-cell *matHeaderCellDef>Control</th>
          <td mat-cell *matCellDef="let c">@if (c.control) { <ohm-control-status [status]="c.control" /> }</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="cellColumns"></tr>
        <tr mat-row *matRowDef="let row; columns: cellColumns"></tr>
      </table>
      @if (loaded() && bench().cells.length === 0) {
        <ohm-empty-state icon="science" heading="No cells yet"><p>Add the cells you measure with, then record a KCl standard run on each.</p></ohm-empty-state>
      }
    </div>

    <h2>Instruments</h2>
    <div class="ohm-table-card">
      <table mat-table [dataSource]="bench().instruments" aria-label="Instruments">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef>Instrument</th>
          <td mat-cell *matCellDef="let i">{{ i.name }}</td>
        </ng-container>
        <ng-container matColumnDef="model">
          <th mat-header-cell *matHeaderCellDef>Model</th>
          <td mat-cell *matCellDef="let i">{{ i.model }}</td>
        </ng-container>
        <ng-container matColumnDef="serial">
          <th mat-header-cell *matHeaderCellDef>Serial number</th>
          <td mat-cell *matCellDef="let i">{{ i.serialNumber }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="instrumentColumns"></tr>
        <tr mat-row *matRowDef="let row; columns: instrumentColumns"></tr>
      </table>
      @if (loaded() && bench().instruments.length === 0) {
        <ohm-empty-state icon="memory" heading="No instruments yet"><p>Add the impedance analysers on your bench.</p></ohm-empty-state>
      }
    </div>

    @if (isAdmin) {
      <section class="add">
        <form [formGroup]="cellForm" (ngSubmit)="addCell()" aria-label="Add a cell">
          <h2>Add a cell</h2>
          <mat-form-field><mat-label>Name</mat-label><input matInput formControlName="name" required />
</mat-form-field>
          <mat-form-field><mat-label>Nominal constant</mat-label><input matInput type="number" step="0.01" formControlName="nominalConstantPerCm" required /><span matTextSuffix>cm⁻¹</span></mat-form-field>
          @if (cellError()) { <p class="error" role="alert">{{ cellError() }}</p> }
          <button mat-flat-button type="submit" [disabled]="cellForm.invalid"><mat-icon>add</mat-icon>Add cell</button>
        </form>
        <form [formGroup]="instrumentForm" (ngSubmit)="addInstrument()" aria-label="Add an instrument">
          <h2>Add an instrument</h2>
          <mat-form-field><mat-label>Name</mat-label><input matInput formControlName="name" required />
</mat-form-field>
          <mat-form-field><mat-label>Model</mat-label><input matInput formControlName="model" /></mat-form-field>
          <mat-form-field><mat-label>Serial number</mat-label><input matInput formControlName="serialNumber" /></mat-form-field>
          @if (instrumentError()) { <p class="error" role="alert">{{ instrumentError() }}</p> }
          <button mat-flat-button type="submit" [disabled]="instrumentForm.invalid"><mat-icon>add</mat-icon>Add instrument</button>
        </form>
      </section>
    }
  `,
  styles: `
    h2 { font: var(--mat-sys-title-medium); margin: 20px 0 8px; }
    .add { display: grid; grid-template-columns: repeat(auto-fit, minmax(280px, 1fr)); gap: 24px; margin-top: 16px; }
    .add form { display: flex; flex-direction: column; align-items: stretch; }
    .add button { align-self: flex-start; }
    .error { color: var(--mat-sys-error); margin: 0 0 8px; }
  `,
})
export class BenchPage {
  private readonly data = inject(BenchData);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(FormBuilder).nonNullable;
  protected readonly isAdmin = inject(Session).hasAnyRole(['lab-admin']);
  protected readonly bench = signal<BenchEquipment>({ instruments: [], cells: [] });
  protected readonly loaded = signal(false);
  protected readonly cellColumns = ['name', 'nominal', 'latest', 'state'];
  protected readonly instrumentColumns = ['name', 'model', 'serial'];
  protected readonly cellError = signal<string | null>(null);
  protected readonly instrumentError = signal<string | null>(null);
  protected readonly cellForm = this.fb.group({ name: ['', [Validators.required, Validators.maxLength(120)]], nominalConstantPerCm: [1, [Validators.required, Validators.min(0.001), Validators.max(1000)]] });
  protected readonly instrumentForm = this.fb.group({ name: ['', [Validators.required, Validators.maxLength(120)]], model: [''], serialNumber: [''] });

  constructor() {
    this.data.equipment().subscribe((b) => {
      this.bench.set(b);
      this.loaded.set(true);
    });
  }

  protected addCell(): void {
    this.data.addCell(this.cellForm.getRawValue()).subscribe({
      next: (b) => {
        this.bench.set(b);
        this.notifier.success(`Cell ${this.cellForm.getRawValue().name} added.`);
        this.cellForm.reset();
        this.cellError.set(null);
      },
      error: (e: unknown) => this.cellError.set(ApiProblem.from(e).summary),
    });
  }

  protected addInstrument(): void {
    this.data.addInstrument(this.instrumentForm.getRawValue()).subscribe({
      next: (b) => {
        this.bench.set(b);
        this.notifier.success(`Instrument ${this.instrumentForm.getRawValue().name} added.`);
        this.instrumentForm.reset();
        this.instrumentError.set(null);
      },
      error: (e: unknown) => this.instrumentError.set(ApiProblem.from(e).summary),
    });
  }
}
