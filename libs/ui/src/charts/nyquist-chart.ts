import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { legendFor } from './bode-chart';
import { ChartAxes } from './chart-axes';
import { ChartFrame } from './chart-frame';
import { ChartLegend } from './chart-legend';
import type { ReferenceBand, SpectrumSeries } from './chart-types';
import { nyquistLayout } from './nyquist-layout';
import { spectrumSummary, spectrumTable } from './spectrum-table';

let nextId = 0;

/** −Z″ against Z′ on equal axes, decades of frequency marked along the first spectrum. */
@Component({
  selector: 'ohm-nyquist-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChartAxes, ChartFrame, ChartLegend],
  styleUrl: './chart-svg.css',
  template: `
    <ohm-chart-frame [heading]="heading()" [table]="table()">
      <svg role="img" [attr.viewBox]="'0 0 ' + layout().width + ' ' + layout().height" [attr.aria-labelledby]="titleId">
        <title [id]="titleId">{{ summary() }}</title>
        <svg:g ohmChartAxes [area]="layout().area" [xTicks]="layout().xTicks" [yTicks]="layout().yTicks" [xLabel]="layout().xLabel" [yLabel]="layout().yLabel" />
        <svg:clipPath [attr.id]="clipId">
          <svg:rect [attr.x]="layout().area.left" [attr.y]="layout().area.top" [attr.width]="layout().area.width" [attr.height]="layout().area.height" />
        </svg:clipPath>
        <svg:g [attr.clip-path]="'url(#' + clipId + ')'">
          @if (layout().band) {
            <svg:path class="band" [attr.d]="layout().band" />
          }
          @for (s of layout().series; track $index) {
            <svg:path class="series" [class.muted]="s.muted" [attr.d]="s.d" [attr.stroke]="s.style.stroke" [attr.stroke-dasharray]="s.style.dash || null" />
            <svg:path class="markers" [class.muted]="s.muted" [attr.d]="s.markers" [attr.fill]="s.style.stroke" />
          }
          @for (m of layout().frequencyMarks; track $index) {
            <svg:circle class="annotation" r="2" [attr.cx]="m.x" [attr.cy]="m.y" />
            @if (m.label && m.box?.placed) {
              <svg:text class="tick-label" data-label="frequency" [attr.x]="m.box!.x" [attr.y]="m.box!.y + 10.5">{{ m.label }}</svg:text>
            }
          }
        </svg:g>
      </svg>
      <ohm-chart-legend [items]="legend()" />
    </ohm-chart-frame>
  `,
})
export class NyquistChart {
  readonly series = input.required<readonly SpectrumSeries[]>();
  readonly band = input<ReferenceBand | null>(null);
  readonly unit = input('Ω');
  readonly heading = input('Nyquist plot');

  protected readonly titleId = `ohm-nyquist-${nextId}`;
  protected readonly clipId = `ohm-nyquist-clip-${nextId++}`;
  protected readonly layout = computed(() => nyquistLayout(this.series(), this.band(), 640, 400, this.unit()));
  protected readonly summary = computed(() => spectrumSummary('Nyquist plot (equal axes)', this.series(), this.band(), this.unit()));
  protected readonly table = computed(() => spectrumTable(this.series(), this.unit(), `${this.heading()}: values by frequency`));
  protected readonly legend = computed(() => legendFor(this.layout().series, this.band()));
}
