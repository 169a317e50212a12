import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ControlChartView } from '@ohmprint/contracts';

const W = 720;
const H = 260;
const PAD = { left: 64, right: 70, top: 16, bottom: 36 };

/** The cell constant run by run, with the centre line and the ±3σ limits; broken runs marked ✕. */
@Component({
  selector: 'ohm-control-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe],
  template: `
    <svg role="img" [attr.viewBox]="'0 0 ' + w + ' ' + h" [attr.aria-label]="summary()">
      @for (t of layout().yTicks; track t.v) {
        <line class="grid" [attr.x1]="pad.left" [attr.x2]="w - pad.right" [attr.y1]="t.y" [attr.y2]="t.y" />
        <text class="tick" [attr.x]="pad.left - 6" [attr.y]="t.y + 4" text-anchor="end">{{ t.v.toFixed(4) }}</text>
      }
      @for (l of layout().lines; track l.label) {
        <line [class]="'limit ' + l.kind" [attr.x1]="pad.left" [attr.x2]="w - pad.right" [attr.y1]="l.y" [attr.y2]="l.y" />
        <text class="limit-label" [attr.x]="w - pad.right + 4" [attr.y]="l.y + 4">{{ l.label }}</text>
      }
      <path class="series" [attr.d]="layout().path" />
      @for (p of layout().points; track p.id) {
        @if (p.broken) {
          <path class="broken" [attr.d]="'M' + (p.x - 5) + ',' + (p.y - 5) + 'l10,10m0,-10l-10,10'"><title>{{ p.title }}</title></path>
        } @else {
          <circle [class]="p.baseline ? 'point baseline' : 'point'" [attr.cx]="p.x" [attr.cy]="p.y" r="4"><title>{{ p.title }}</title></circle>
        }
      }
      <text class="axis" [attr.x]="pad.left + (w - pad.left - pad.right) / 2" [attr.y]="h - 6" text-anchor="middle">Standard runs, oldest first</text>
      <text class="axis" [attr.transform]="'translate(14,' + (h / 2) + ') rotate(-90)'" text-anchor="middle">Cell constant (cm⁻¹)</text>
    </svg>
    <p class="legend"><span class="key dot"></span>run (hollow: baseline) <span class="key cross">✕</span>run that broke a rule <span class="key dash"></span>±3σ limits</p>
    <table class="cdk-visually-hidden">
      <caption>{{ summary() }}</caption>
      <tr><th>Measured</th><th>Cell constant</th><th>Rules broken</th></tr>
      @for (r of chart().runs; track r.id) {
        <tr><td>{{ r.measuredAt | date: 'd MMM y, HH:mm' }}</td><td>{{ r.cellConstantPerCm }}</td><td>{{ r.signals.map(ruleOf).join('; ') || 'none' }}</td></tr>
      }
    </table>
  `,
  styles: `
    :host { display: block; }
    svg { width: 100%; max-width: 900px; height: auto; font: 12px Inter, sans-serif; }
    .grid { stroke: var(--mat-sys-outline-variant); stroke-width: 0.6; }
    .tick, .axis, .limit-label { fill: var(--mat-sys-on-surface-variant); }
    .limit { stroke-width: 1.4; }
    .limit.centre { stroke: var(--mat-sys-on-surface-variant); }
    .limit.bound { stroke: var(--mat-sys-error); stroke-dasharray: 6 4; }
    .series { fill: none; stroke: var(--mat-sys-primary); stroke-width: 1.4; }
    .point { fill: var(--mat-sys-primary); stroke: var(--mat-sys-primary); }
    .point.baseline { fill: var(--mat-sys-surface); stroke-width: 1.6; }
    .broken { stroke: var(--mat-sys-error); stroke-width: 2.6; }
    .legend { display: flex; gap: 6px 14px; flex-wrap: wrap; align-items: center; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); margin: 4px 0 0; }
    .key { display: inline-block; margin-right: -8px; }
    .key.dot { width: 8px; height: 8px; border-radius: 50%; background: var(--mat-sys-primary); }
    .key.cross { color: var(--mat-sys-error); font-weight: 700; }
    .key.dash { width: 18px; border-top: 2px dashed var(--mat-sys-error); }
  `,
})
export class ControlChart {
  readonly chart = input.required<ControlChartView>();
  protected readonly w = W;
  protected readonly h = H;
  protected readonly pad = PAD;
  protected readonly ruleOf = (s: { message: string }) => s.message;

  protected readonly summary = computed(() => {
    const c = this.chart();
    const limits = c.centre === null ? 'limits not set yet' : `centre ${c.centre.toFixed(4)}, limits ${c.lowerLimit?.toFixed(4)}–${c.upperLimit?.toFixed(4)} cm⁻¹`;
    return `Control chart of ${c.cell.name}: ${c.runs.length} standard runs, ${limits}. ${c.status.message}`;
  });

  protected readonly layout = computed(() => {
    const c = this.chart();
    const values = c.runs.map((r) => r.cellConstantPerCm);
    const extent = [...values, ...(c.upperLimit !== null ? [c.upperLimit, c.lowerLimit as number] : [])];
    let lo = extent.length ? Math.min(...extent) : 0.99;
    let hi = extent.length ? Math.max(...extent) : 1.01;
    const margin = (hi - lo || Math.abs(hi) * 0.01 || 1) * 0.08;
    lo -= margin;
    hi += margin;
    const x = (i: number) => PAD.left + (values.length <= 1 ? (W - PAD.left - PAD.right) / 2 : (i / (values.length - 1)) * (W - PAD.left - PAD.right));
    const y = (v: number) => PAD.top + (1 - (v - lo) / (hi - lo)) * (H - PAD.top - PAD.bottom);
    const points = c.runs.map((r, i) => ({
      id: r.id,
      x: x(i),
      y: y(r.cellConstantPerCm),
      broken: r.signals.length > 0,
      baseline: r.inBaseline,
      title: `${r.measuredAt.slice(0, 16).replace('T', ' ')}: K = ${r.cellConstantPerCm.toFixed(5)} cm⁻¹${r.signals.length ? ` — ${r.signals.map((s) => s.message).join('; ')}` : ''}`,
    }));
    const lines = c.centre === null ? [] : [
      { kind: 'centre', label: 'centre', y: y(c.centre) },
      { kind: 'bound', label: '+3σ', y: y(c.upperLimit as number) },
      { kind: 'bound', label: '−3σ', y: y(c.lowerLimit as number) },
    ];
    const yTicks = Array.from({ length: 5 }, (_, i) => lo + ((hi - lo) * i) / 4).map((v) => ({ v, y: y(v) }));
    return { points, lines, yTicks, path: points.map((p, i) => `${i ? 'L' : 'M'}${p.x.toFixed(1)},${p.y.toFixed(1)}`).join('') };
  });
}
