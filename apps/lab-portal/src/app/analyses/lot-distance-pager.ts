import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { LotDistancePage } from '@ohmprint/contracts';
import { AnalysesData } from './analyses-data';

const PAGE = 50;

/**
 * Every reference lot's distance to the sample, fifty at a time, nearest first. Nothing is fetched
 * until the reader asks: a library of 50,000 lots would otherwise cost a row per lot.
 */
@Component({
  selector: 'ohm-lot-distance-pager',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, MatButtonModule],
  template: `
    @if (page(); as p) {
      <table class="plain">
        <caption>Lots {{ p.items[0]?.rank ?? 0 }}–{{ p.items[p.items.length - 1]?.rank ?? 0 }} of {{ p.total | number }}, nearest first</caption>
        <thead><tr><th scope="col">Rank</th><th scope="col">Lot</th><th scope="col">Canberra distance</th></tr></thead>
        <tbody>
          @for (d of p.items; track d.lotId) {
            <tr [class.nearest]="d.lotId === nearestId()"><td>{{ d.rank }}</td><td>{{ d.lotCode }}</td><td>{{ d.distance | number: '1.4-4' }}</td></tr>
          }
        </tbody>
      </table>
      <div class="pager">
        <button mat-button type="button" [disabled]="after() === 0 || loading()" (click)="load(after() - pageSize)">Previous {{ pageSize }}</button>
        <button mat-button type="button" [disabled]="p.next === null || loading()" (click)="load(p.next ?? 0)">Next {{ pageSize }}</button>
        <button mat-button type="button" (click)="page.set(null)">Hide</button>
      </div>
    } @else {
      <button mat-stroked-button type="button" [disabled]="loading()" (click)="load(0)">Show every lot’s distance ({{ lotCount() | number }} lots, {{ pageSize }} a page)</button>
    }
  `,
  styles: `
    .pager { display: flex; gap: 8px; margin-top: 4px; }
    caption { text-align: start; padding: 8px 8px 2px; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .plain { border-collapse: collapse; width: 100%; font: var(--mat-sys-body-small); font-variant-numeric: tabular-nums; }
    .plain th, .plain td { text-align: left; padding: 3px 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .plain th { font-weight: 500; color: var(--mat-sys-on-surface-variant); }
    .plain tr.nearest { font-weight: 600; }
  `,
})
export class LotDistancePager {
  private readonly data = inject(AnalysesData);
  readonly analysisId = input.required<string>();
  readonly lotCount = input.required<number>();
  readonly nearestId = input<string | null>(null);
  protected readonly pageSize = PAGE;
  protected readonly page = signal<LotDistancePage | null>(null);
  protected readonly after = signal(0);
  protected readonly loading = signal(false);

  protected load(after: number): void {
    const from = Math.max(0, after);
    this.loading.set(true);
    this.data.lotDistances(this.analysisId(), from, PAGE).subscribe({
      next: (p) => {
        this.after.set(from);
        this.page.set(p);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }
}
