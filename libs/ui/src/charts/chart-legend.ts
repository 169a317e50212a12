import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { markerPath, type SeriesStyle } from './series-style';

/** One legend entry: a line with its marker, or a shaded swatch for a band. */
export interface LegendItem {
  readonly label: string;
  readonly style?: SeriesStyle;
  readonly muted?: boolean;
  readonly swatch: 'line' | 'band';
}

@Component({
  selector: 'ohm-chart-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <ul class="legend">
      @for (item of items(); track item.label) {
        <li [class.muted]="item.muted">
          <svg width="28" height="12" aria-hidden="true">
            @if (item.swatch === 'band') {
              <svg:rect class="band" x="1" y="1" width="26" height="10" />
            } @else if (item.style; as s) {
              <svg:line x1="1" x2="27" y1="6" y2="6" class="line" [attr.stroke]="s.stroke" [attr.stroke-dasharray]="s.dash || null" />
              <svg:path [attr.d]="marker(s)" [attr.fill]="s.stroke" />
            }
          </svg>
          {{ item.label }}
        </li>
      }
    </ul>
  `,
  styles: `
    .legend { display: flex; flex-wrap: wrap; gap: 4px 16px; margin: 4px 0 0; padding: 0; list-style: none;
      font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    li { display: inline-flex; align-items: center; gap: 6px; white-space: nowrap; }
    li.muted { opacity: 0.55; }
    .line { stroke-width: 1.6; }
    .band { fill: var(--mat-sys-primary); fill-opacity: 0.18; }
  `,
})
export class ChartLegend {
  readonly items = input.required<readonly LegendItem[]>();

  protected marker(s: SeriesStyle): string {
    return markerPath(s.marker, 14, 6, 3);
  }
}
