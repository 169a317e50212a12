import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { bodeLayout } from './bode-layout';
import { ChartAxes } from './chart-axes';
import { ChartFrame } from './chart-frame';
import { ChartLegend, type LegendItem } from './chart-legend';
import type { ReferenceBand, SpectrumSeries } from './chart-types';
import { spectrumSummary, spectrumTable } from './spectrum-table';

let nextId = 0;

/** |Z| and phase against log frequency, two panels sharing the frequency axis. */
@Component({
  selector: 'ohm-bode-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChartAxes, ChartFrame, ChartLegend],
  styleUrl: './chart-svg.css',
  template: `
    <ohm-chart-frame [heading]="heading()" [table]="table()">
      <svg role="img" [attr.viewBox]="'0 0 ' + layout().width + ' ' + layout().height" [attr.aria-labelledby]="titleId">
        <title [id]="titleId">{{ summary() }}</title>
        @for (panel of [layout().magnitude, layout().phase]; track $index) {
          <svg:g ohmChartAxes [area]="panel.area" [xTicks]="panel.xTicks" [yTicks]="panel.yTicks" [xLabel]="panel.xLabel" [yLabel]="panel.yLabel" />
          @if (panel.band) {
            <svg:path class="band" [attr.d]="panel.band" />
          }
          @for (s of panel.series; track $index) {
            <svg:path class="series" [class.muted]="s.muted" [attr.d]="s.d" [attr.stroke]="s.style.stroke" [attr.stroke-dasharray]="s.style.dash || null" />
            <svg:path class="markers" [class.muted]="s.muted" [attr.d]="s.markers" [attr.fill]="s.style.stroke" />
          }
        }
      </svg>
      <ohm-chart-legend [items]="legend()" />
    </ohm-chart-frame>
  `,
})
export class BodeChart {
  readonly series = input.required<readonly SpectrumSeries[]>();
  readonly band = input<ReferenceBand | null>(null);
  /** Impedance unit of the data, e.g. "Ω" or "Ω·cm" after normalisation. */
  readonly unit = input('Ω');
  readonly heading = input('Bode plot');

  protected readonly titleId = `ohm-bode-${nextId++}`;
  protected readonly layout = computed(() => bodeLayout(this.series(), this.band(), 640, 440, this.unit()));
  protected readonly summary = computed(() => spectrumSummary('Bode plot', this.series(), this.band(), this.unit()));
  protected readonly table = computed(() => spectrumTable(this.series(), this.unit(), `${this.heading()}: values by frequency`));
  protected readonly legend = computed<LegendItem[]>(() => legendFor(this.layout().magnitude.series, this.band()));
}

export function legendFor(series: readonly { label: string; style: LegendItem['style']; muted: boolean }[], band: ReferenceBand | null): LegendItem[] {
  return [
    ...series.map((s) => ({ label: s.muted ? `${s.label} (excluded)` : s.label, style: s.style, muted: s.muted, swatch: 'line' as const })),
    ...(band ? [{ label: band.label, swatch: 'band' as const }] : []),
  ];
}
