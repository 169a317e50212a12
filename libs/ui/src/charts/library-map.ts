import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { Verdict } from '@ohmprint/contracts';
import { ChartAxes } from './chart-axes';
import { ChartFrame } from './chart-frame';
import type { ChartTable } from './chart-types';
import { libraryMapLayout, type MapPoint } from './library-map-layout';
import { formatNumber } from './si-format';

let nextId = 0;

/** The sample among its reference lots on a 2-D map (classical MDS of the distance matrix). */
@Component({
  selector: 'ohm-library-map',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // The sample's mark takes its verdict's colour; the chip beside the chart says the word.
  host: { '[style.--ohm-sample-mark]': "verdict() ? 'var(--ohm-verdict-' + verdict() + '-mark)' : null" },
  imports: [ChartAxes, ChartFrame],
  styleUrl: './chart-svg.css',
  template: `
    <ohm-chart-frame [heading]="heading()" [table]="table()">
      <svg role="img" [attr.viewBox]="'0 0 ' + layout().width + ' ' + layout().height" [attr.aria-labelledby]="titleId">
        <title [id]="titleId">{{ summary() }}</title>
        <svg:g ohmChartAxes [area]="layout().area" [xTicks]="layout().xTicks" [yTicks]="layout().yTicks" [xLabel]="axisLabel(0)" [yLabel]="axisLabel(1)" [yLabelOffset]="40" />
        @if (layout().link; as k) {
          <svg:line class="link" [attr.x1]="k.x1" [attr.y1]="k.y1" [attr.x2]="k.x2" [attr.y2]="k.y2" />
        }
        @for (p of layout().points; track p.id) {
          @if (p.kind === 'sample') {
            <svg:path class="sample" [attr.d]="'M' + p.px + ',' + (p.py - 8) + 'l8,8l-8,8l-8,-8z'" />
          } @else {
            <svg:circle class="lot" [class.nearest]="p.nearest" [attr.r]="p.nearest ? 6 : 4.5" [attr.cx]="p.px" [attr.cy]="p.py" />
          }
        }
        @for (l of layout().labels; track l.id) {
          @if (l.placed) {
            @if (l.leader; as k) {
              <svg:line class="leader" [attr.x1]="k.x1" [attr.y1]="k.y1" [attr.x2]="k.x2" [attr.y2]="k.y2" />
            }
            <svg:text class="label" [class.strong]="l.kind !== 'lot'" [attr.data-label]="l.kind" [attr.x]="l.x" [attr.y]="l.y + 10.5">{{ l.text }}</svg:text>
          }
        }
      </svg>
      <ul class="key">
        <li><svg width="14" height="14" aria-hidden="true"><svg:circle class="lot" cx="7" cy="7" r="4.5" /></svg> Reference lot</li>
        <li><svg width="16" height="16" aria-hidden="true"><svg:path class="sample" d="M8,0l8,8l-8,8l-8,-8z" /></svg> Sample</li>
      </ul>
    </ohm-chart-frame>
  `,
  styles: `
    .lot { fill: var(--mat-sys-secondary); fill-opacity: 0.75; stroke: var(--mat-sys-surface); stroke-width: 1; }
    .lot.nearest { fill: var(--mat-sys-tertiary); fill-opacity: 1; stroke: var(--mat-sys-on-surface); }
    .sample { fill: var(--ohm-sample-mark, var(--mat-sys-primary)); stroke: var(--mat-sys-on-surface); stroke-width: 1.2; }
    .link { stroke: var(--mat-sys-on-surface-variant); stroke-dasharray: 4 3; }
    .label { fill: var(--mat-sys-on-surface); paint-order: stroke; stroke: var(--mat-sys-surface); stroke-width: 3px; stroke-linejoin: round; }
    .leader { stroke: var(--mat-sys-on-surface-variant); stroke-width: 0.8; }
    .label.strong { font-weight: 600; }
    .key { display: flex; gap: 16px; margin: 4px 0 0; padding: 0; list-style: none; font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant); }
    .key li { display: inline-flex; align-items: center; gap: 6px; white-space: nowrap; }
  `,
})
export class LibraryMap {
  readonly points = input.required<readonly MapPoint[]>();
  readonly nearestId = input<string | null>(null);
  readonly verdict = input<Verdict | null>(null);
  readonly heading = input('Map of the sample among the reference lots');
  /** Each axis's share of the spread (0–1), from the map's eigenvalues; absent on older analyses. */
  readonly axisShares = input<readonly [number, number] | null>(null);

  protected readonly titleId = `ohm-map-${nextId++}`;
  protected readonly layout = computed(() => libraryMapLayout(this.points(), this.nearestId(), 560, 380));
  protected axisLabel(k: 0 | 1): string {
    const share = this.axisShares()?.[k];
    return share === undefined || !Number.isFinite(share) ? `Map axis ${k + 1}` : `Map axis ${k + 1} (${Math.round(share * 100)} % of spread)`;
  }

  protected readonly summary = computed(() => {
    const lots = this.points().filter((p) => p.kind === 'reference').length;
    const nearest = this.points().find((p) => p.id === this.nearestId());
    return `Map of ${lots} reference lots and the sample; distances on the map approximate spectral distances${nearest ? `; nearest lot ${nearest.label}` : ''}.`;
  });
  protected readonly table = computed<ChartTable>(() => ({
    caption: 'Map coordinates',
    columns: ['Point', 'Kind', 'Axis 1', 'Axis 2'],
    rows: this.points().map((p) => [
      p.id === this.nearestId() ? `${p.label} (nearest)` : p.label,
      p.kind === 'sample' ? 'Sample' : 'Reference lot',
      formatNumber(p.x, 3),
      formatNumber(p.y, 3),
    ]),
  }));
}
