import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { ChartAxes } from './chart-axes';
import { ChartFrame } from './chart-frame';
import { ChartLegend, type LegendItem } from './chart-legend';
import type { ChartTable } from './chart-types';
import { kkResidualLayout, type KkResiduals } from './kk-residual-layout';
import { formatHz, formatNumber } from './si-format';

let nextId = 0;

/** Kramers–Kronig residuals in % of |Z| against log frequency, with the method's ±limit lines. */
@Component({
  selector: 'ohm-kk-residual-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChartAxes, ChartFrame, ChartLegend],
  styleUrl: './chart-svg.css',
  template: `
    <ohm-chart-frame [heading]="heading()" [table]="table()">
      <svg role="img" [attr.viewBox]="'0 0 ' + layout().width + ' ' + layout().height" [attr.aria-labelledby]="titleId">
        <title [id]="titleId">{{ summary() }}</title>
        <svg:g ohmChartAxes [area]="layout().area" [xTicks]="layout().xTicks" [yTicks]="layout().yTicks" [xLabel]="layout().xLabel" [yLabel]="layout().yLabel" [yLabelOffset]="44" />
        @for (y of [layout().limitLines.upper, layout().limitLines.lower]; track $index) {
          <svg:line class="limit" [attr.x1]="layout().area.left" [attr.x2]="layout().area.left + layout().area.width" [attr.y1]="y" [attr.y2]="y" />
        }
        <svg:text class="tick-label" text-anchor="end" dy="-4" [attr.x]="layout().area.left + layout().area.width - 4" [attr.y]="layout().limitLines.upper">
          limit ±{{ limitText() }} %
        </svg:text>
        @for (s of layout().series; track $index) {
          <svg:path class="series" [attr.d]="s.d" [attr.stroke]="s.style.stroke" [attr.stroke-dasharray]="s.style.dash || null" />
          <svg:path class="markers" [attr.d]="s.markers" [attr.fill]="s.style.stroke" />
        }
        @for (p of layout().outside; track $index) {
          <svg:circle class="outside" r="5" [attr.cx]="p.x" [attr.cy]="p.y" />
        }
      </svg>
      <ohm-chart-legend [items]="legend()" />
    </ohm-chart-frame>
  `,
  styles: `
    .limit { stroke: var(--mat-sys-error); stroke-dasharray: 5 4; stroke-width: 1.2; }
    .outside { fill: none; stroke: var(--mat-sys-error); stroke-width: 1.4; }
  `,
})
export class KkResidualChart {
  readonly residuals = input.required<KkResiduals>();
  readonly heading = input('Kramers–Kronig residuals');

  protected readonly titleId = `ohm-kk-${nextId++}`;
  protected readonly layout = computed(() => kkResidualLayout(this.residuals(), 640, 260));
  protected readonly limitText = computed(() => formatNumber(this.residuals().limitPercent, 3));
  protected readonly summary = computed(() => {
    const r = this.residuals();
    const worst = Math.max(...Array.from(r.rePercent, Math.abs), ...Array.from(r.imPercent, Math.abs));
    const verdict = worst <= r.limitPercent ? 'within the limit' : `${this.layout().outside.length} points beyond the limit`;
    return `Kramers–Kronig residuals: largest ${formatNumber(worst, 3)} % of |Z| against a limit of ±${this.limitText()} %, ${verdict}.`;
  });
  protected readonly table = computed<ChartTable>(() => {
    const r = this.residuals();
    return {
      caption: `${this.heading()} (limit ±${this.limitText()} %)`,
      columns: ['Frequency', 'Z′ residual (%)', 'Z″ residual (%)'],
      rows: Array.from(r.frequencyHz, (f, i) => [formatHz(f), formatNumber(r.rePercent[i], 3), formatNumber(r.imPercent[i], 3)]),
    };
  });
  protected readonly legend = computed<LegendItem[]>(() =>
    this.layout().series.map((s) => ({ label: s.label, style: s.style, swatch: 'line' as const })),
  );
}
