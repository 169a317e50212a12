import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { ChartAxes } from './chart-axes';
import { ChartFrame } from './chart-frame';
import { ChartLegend, type LegendItem } from './chart-legend';
import type { ChartTable } from './chart-types';
import { kkResidualLayout, type KkResiduals } from './kk-residual-layout';
import { formatHz, formatNumber } from './si-format';

let nextId = 0;

/** How far the measured points sit from the fitted model: residuals in % of |Z| against log frequency. */
@Component({
  selector: 'ohm-fit-residual-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChartAxes, ChartFrame, ChartLegend],
  styleUrl: './chart-svg.css',
  template: `
    <ohm-chart-frame [heading]="heading()" [table]="table()">
      <svg role="img" [attr.viewBox]="'0 0 ' + layout().width + ' ' + layout().height" [attr.aria-labelledby]="titleId">
        <title [id]="titleId">{{ summary() }}</title>
        <svg:g ohmChartAxes [area]="layout().area" [xTicks]="layout().xTicks" [yTicks]="layout().yTicks" [xLabel]="layout().xLabel" [yLabel]="layout().yLabel" [yLabelOffset]="44" />
        <svg:line class="zero" [attr.x1]="layout().area.left" [attr.x2]="layout().area.left + layout().area.width" [attr.y1]="zeroY()" [attr.y2]="zeroY()" />
        @for (s of layout().series; track $index) {
          <svg:path class="series residual" [attr.d]="s.d" [attr.stroke]="s.style.stroke" [attr.stroke-dasharray]="s.style.dash || null" />
          <svg:path class="markers" [attr.d]="s.markers" [attr.fill]="s.style.stroke" />
        }
      </svg>
      <ohm-chart-legend [items]="legend()" />
    </ohm-chart-frame>
  `,
  styles: `
    .zero { stroke: var(--mat-sys-on-surface-variant); stroke-width: 1; }
  `,
})
export class FitResidualChart {
  readonly residuals = input.required<Omit<KkResiduals, 'limitPercent'>>();
  readonly heading = input('Fit residuals');

  protected readonly titleId = `ohm-fit-residuals-${nextId++}`;
  // No pass limit here: the axis is sized by the residuals alone.
  protected readonly layout = computed(() => kkResidualLayout({ ...this.residuals(), limitPercent: 0 }, 640, 220));
  /** With a limit of 0 the layout's limit lines both sit on zero. */
  protected readonly zeroY = computed(() => this.layout().limitLines.upper);
  protected readonly worst = computed(() => {
    const r = this.residuals();
    return Math.max(0, ...Array.from(r.rePercent, Math.abs), ...Array.from(r.imPercent, Math.abs));
  });
  protected readonly summary = computed(() => `Residuals of the fitted model: largest ${formatNumber(this.worst(), 3)} % of |Z|.`);
  protected readonly table = computed<ChartTable>(() => {
    const r = this.residuals();
    return {
      caption: this.heading(),
      columns: ['Frequency', 'Z′ residual (%)', 'Z″ residual (%)'],
      rows: Array.from(r.frequencyHz, (f, i) => [formatHz(f), formatNumber(r.rePercent[i], 3), formatNumber(r.imPercent[i], 3)]),
    };
  });
  protected readonly legend = computed<LegendItem[]>(() => this.layout().series.map((s) => ({ label: s.label, style: s.style, swatch: 'line' as const })));
}
