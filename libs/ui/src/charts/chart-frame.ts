import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ChartTable } from './chart-types';

/**
 * The heading and "show as table" switch every chart shares. The table carries the same figures
 * as the plot, for screen readers, copying into a lab notebook and anyone who reads numbers better.
 */
@Component({
  selector: 'ohm-chart-frame',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    <figure class="frame">
      <figcaption>
        <span class="heading">{{ heading() }}</span>
        <button mat-button type="button" class="toggle" [attr.aria-pressed]="showTable()" (click)="toggleTable()">
          {{ showTable() ? 'Show as chart' : 'Show as table' }}
        </button>
      </figcaption>
      @if (showTable()) {
        <div class="table-wrap" tabindex="0" role="region" [attr.aria-label]="table().caption">
          <table>
            <caption>{{ table().caption }}</caption>
            <thead>
              <tr>
                @for (c of table().columns; track $index) {
                  <th scope="col">{{ c }}</th>
                }
              </tr>
            </thead>
            <tbody>
              @for (row of table().rows; track $index) {
                <tr>
                  @for (cell of row; track $index) {
                    <td>{{ cell }}</td>
                  }
                </tr>
              }
            </tbody>
          </table>
        </div>
      } @else {
        <ng-content />
      }
    </figure>
  `,
  styles: `
    .frame { margin: 0; }
    figcaption { display: flex; align-items: center; gap: 8px; margin-bottom: 4px; }
    .heading { font: var(--mat-sys-title-small); color: var(--mat-sys-on-surface); flex: 1 1 auto; }
    .table-wrap { max-height: 360px; overflow: auto; border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-small); }
    table { border-collapse: collapse; width: 100%; font: var(--mat-sys-body-small); }
    caption { text-align: left; padding: 6px 8px; color: var(--mat-sys-on-surface-variant); }
    th, td { padding: 3px 8px; text-align: right; border-bottom: 1px solid var(--mat-sys-outline-variant);
      font-variant-numeric: tabular-nums; white-space: nowrap; }
    th { position: sticky; top: 0; background: var(--mat-sys-surface-container); font-weight: 500; }
    th:first-child, td:first-child { text-align: left; }
  `,
})
export class ChartFrame {
  readonly heading = input.required<string>();
  readonly table = input.required<ChartTable>();
  protected readonly showTable = signal(false);

  protected toggleTable(): void {
    this.showTable.update((v) => !v);
  }
}
