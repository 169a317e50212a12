import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { Verdict } from '@ohmprint/contracts';
import { ChartAxes } from './chart-axes';
import { ChartFrame } from './chart-frame';
import type { ChartTable } from './chart-types';
import { LABEL_BASELINE, distanceHistogramLayout, type DistanceHistogramInput } from './histogram-layout';
import { formatNumber } from './si-format';

let nextId = 0;

/** The library's calibration distances as a histogram, with T95, T99 and the sample's distance. */
@Component({
  selector: 'ohm-distance-histogram',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // The sample's mark takes its verdict's colour; the chip beside the chart says the word.
  host: { '[style.--ohm-sample-mark]': "verdict() ? 'var(--ohm-verdict-' + verdict() + '-mark)' : null" },
  imports: [ChartAxes, ChartFrame],
  styleUrl: './chart-svg.css',
  template: `
    <ohm-chart-frame [heading]="heading()" [table]="table()">
      <svg role="img" [attr.viewBox]="'0 0 ' + layout().width + ' ' + layout().height" [attr.aria-labelledby]="titleId">
        <title [id]="titleId">{{ summary() }}</title>
        <svg:g ohmChartAxes [area]="layout().area" [xTicks]="layout().xTicks" [yTicks]="layout().yTicks" xLabel="Canberra distance to the nearest lot" yLabel="Lots" [yLabelOffset]="36" />
        @for (b of layout().bars; track $index) {
          <svg:rect class="bar" [attr.x]="b.x" [attr.y]="b.y" [attr.width]="b.w" [attr.height]="b.h" />
        }
        @for (l of layout().lines; track l.kind) {
          <svg:line [class]="'line ' + l.kind" [attr.x1]="l.x" [attr.x2]="l.x" [attr.y1]="layout().area.top" [attr.y2]="layout().area.top + layout().area.height" />
          @if (l.labelBox.placed) {
            @if (l.labelBox.leader; as k) {
              <svg:line class="leader" [attr.x1]="k.x1" [attr.y1]="k.y1" [attr.x2]="k.x2" [attr.y2]="k.y2" />
            }
            <svg:text [class]="'line-label ' + l.kind" [attr.data-label]="l.kind" [attr.x]="l.labelBox.x" [attr.y]="l.labelBox.y + baseline">{{ l.label }}</svg:text>
          }
          @if (l.kind === 'sample') {
            <svg:path class="sample-mark" [attr.d]="'M' + l.x + ',' + (layout().area.top + layout().area.height) + 'l-6,10h12z'" />
          }
        }
      </svg>
    </ohm-chart-frame>
  `,
  styles: `
    .bar { fill: var(--mat-sys-secondary-container); stroke: var(--mat-sys-secondary); stroke-width: 0.8; }
    .line { stroke-width: 1.6; }
    .line.t95 { stroke: var(--mat-sys-tertiary); stroke-dasharray: 6 3; }
    .line.t99 { stroke: var(--mat-sys-error); stroke-dasharray: 2 3; }
    .line.sample { stroke: var(--ohm-sample-mark, var(--mat-sys-primary)); stroke-width: 2.4; }
    .sample-mark { fill: var(--ohm-sample-mark, var(--mat-sys-primary)); }
    .line-label { fill: var(--mat-sys-on-surface); font-weight: 500;
      paint-order: stroke; stroke: var(--mat-sys-surface); stroke-width: 3px; stroke-linejoin: round; }
    .line-label.sample { font-weight: 600; }
    .leader { stroke: var(--mat-sys-on-surface-variant); stroke-width: 0.8; }
  `,
})
export class DistanceHistogram {
  readonly data = input.required<DistanceHistogramInput>();
  readonly verdict = input<Verdict | null>(null);
  readonly heading = input('Sample among the library’s own spread');

  protected readonly titleId = `ohm-histogram-${nextId++}`;
  protected readonly baseline = LABEL_BASELINE;
  protected readonly layout = computed(() => distanceHistogramLayout(this.data(), 640, 260));
  protected readonly summary = computed(() => {
    const d = this.data();
    const parts = [`Histogram of ${d.bins ? d.bins.counts.reduce((a, b) => a + b, 0) : d.calibrationDistances.length} calibration distances`];
    if (d.t95 !== null) parts.push(`T95 ${formatNumber(d.t95, 3)}`);
    if (d.t99 !== null) parts.push(`T99 ${formatNumber(d.t99, 3)}`);
    if (d.sampleDistance !== null) parts.push(`sample distance ${formatNumber(d.sampleDistance, 3)}`);
    return `${parts.join(', ')}.`;
  });
  protected readonly table = computed<ChartTable>(() => ({
    caption: this.summary(),
    columns: ['Distance from', 'to', 'Lots'],
    rows: this.layout().bars.map((b) => [formatNumber(b.from, 3), formatNumber(b.to, 3), String(b.count)]),
  }));
}
