import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import type { CorrelationCell, CorrelationStudy } from '@ohmprint/contracts';

const SW = 420;
const SH = 300;
const P = { left: 70, right: 16, top: 14, bottom: 44 };

const fmt = (v: number) => (Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-2 && v !== 0) ? v.toExponential(2) : v.toPrecision(4));

/** Pearson r of every parameter with every chemistry value as a heat map; a scatter of the chosen pair. */
@Component({
  selector: 'ohm-correlation-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @let s = study();
    @if (!s.chemistry.length) {
      <p>No chemistry is recorded for this version’s lots, so there is nothing to correlate yet. Chemistry comes with the producer’s enrolment (or is added to a lot by the lab).</p>
    } @else {
      <p class="ohm-muted">Pearson r of each {{ s.model }} parameter (fitted to each lot) with each chemistry value, over the lots where both are known; p is two-sided. Choose a cell to see its scatter.</p>
      <div class="layout">
        <table class="heat" aria-label="Correlation of fitted parameters with chemistry">
          <thead><tr><th scope="col"><span class="cdk-visually-hidden">Parameter</span></th>
            @for (f of s.chemistry; track f.field) { <th scope="col">{{ f.label }}@if (f.unit) {<br /><small>{{ f.unit }}</small>}</th> }
          </tr></thead>
          <tbody>
            @for (p of s.parameters; track p.name) {
              <tr>
                <th scope="row">{{ p.name }}@if (p.unit) {&nbsp;<small>({{ p.unit }})</small>}</th>
                @for (f of s.chemistry; track f.field) {
                  @let c = cellOf(p.name, f.field);
                  <td [style.background]="colour(c.r)">
                    <button type="button" [title]="hover(c)" [attr.aria-pressed]="chosen()?.parameter === p.name && chosen()?.chemistry === f.field" (click)="choose(c)">
                      <span class="value">{{ c.r === null ? '–' : c.r.toFixed(2) }} <small>n={{ c.n }}</small></span>
                    </button>
                  </td>
                }
              </tr>
            }
          </tbody>
        </table>
        @if (scatter(); as sc) {
          <figure>
            <svg role="img" [attr.viewBox]="'0 0 ' + sw + ' ' + sh" [attr.aria-label]="sc.label">
              <rect class="frame" [attr.x]="pad.left" [attr.y]="pad.top" [attr.width]="sw - pad.left - pad.right" [attr.height]="sh - pad.top - pad.bottom" />
              @for (t of sc.xTicks; track $index) { <text class="tick" [attr.x]="t.at" [attr.y]="sh - pad.bottom + 14" text-anchor="middle">{{ t.text }}</text> }
              @for (t of sc.yTicks; track $index) { <text class="tick" [attr.x]="pad.left - 4" [attr.y]="t.at + 4" text-anchor="end">{{ t.text }}</text> }
              @for (d of sc.dots; track d.lot) { <circle class="dot" [attr.cx]="d.x" [attr.cy]="d.y" r="4"><title>{{ d.title }}</title></circle> }
              <text class="axis" [attr.x]="pad.left + (sw - pad.left - pad.right) / 2" [attr.y]="sh - 8" text-anchor="middle">{{ sc.xLabel }}</text>
              <text class="axis" [attr.transform]="'translate(14,' + (sh / 2) + ') rotate(-90)'" text-anchor="middle">{{ sc.yLabel }}</text>
            </svg>
            <figcaption>{{ sc.label }}</figcaption>
          </figure>
        }
      </div>
      @if (s.lotsNotFitted.length) { <p class="ohm-muted">Left out (the fit did not converge): {{ s.lotsNotFitted.join(', ') }}</p> }
    }
  `,
  styles: `
    .layout { display: flex; flex-wrap: wrap; gap: 24px; align-items: flex-start; }
    .heat { border-collapse: separate; border-spacing: 2px; }
    .heat th { font: var(--mat-sys-label-large); padding: 4px 8px; text-align: center; }
    .heat th[scope=row] { text-align: right; }
    .heat td { padding: 0; border-radius: 4px; }
    .heat td button { all: unset; box-sizing: border-box; display: flex; justify-content: center; min-width: 96px; padding: 8px; cursor: pointer; font: var(--mat-sys-body-medium); }
    /* the numbers sit on a surface-coloured label, so they read on every shade of the scale */
    .heat .value { padding: 1px 6px; border-radius: 4px; background: var(--mat-sys-surface); color: var(--mat-sys-on-surface); }
    .heat td button:focus-visible { outline: 3px solid var(--mat-sys-primary); outline-offset: 1px; }
    .heat td button[aria-pressed=true] { outline: 3px solid var(--mat-sys-on-surface); }
    figure { margin: 0; }
    svg { width: 420px; max-width: 100%; height: auto; font: 11px Inter, sans-serif; }
    .frame { fill: none; stroke: var(--mat-sys-outline); }
    .tick, .axis { fill: var(--mat-sys-on-surface-variant); }
    .dot { fill: var(--mat-sys-primary); fill-opacity: 0.8; }
    figcaption { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); max-width: 420px; }
  `,
})
export class CorrelationPanel {
  readonly study = input.required<CorrelationStudy>();
  protected readonly sw = SW;
  protected readonly sh = SH;
  protected readonly pad = P;
  protected readonly chosen = signal<CorrelationCell | null>(null);

  protected cellOf(parameter: string, chemistry: string): CorrelationCell {
    return this.study().cells.find((c) => c.parameter === parameter && c.chemistry === chemistry) ?? { parameter, chemistry, r: null, p: null, n: 0 };
  }

  /** Diverging teal (positive) / red (negative) over near-white, stronger with |r|: a data scale, the same in both schemes. */
  protected colour(r: number | null): string {
    if (r === null) return 'var(--mat-sys-surface-container-high)';
    const t = Math.min(1, Math.abs(r));
    const [a, b] = r >= 0 ? [[15, 107, 102], [245, 248, 247]] : [[179, 38, 30], [248, 245, 245]];
    const mix = (i: number) => Math.round(b[i] + (a[i] - b[i]) * t);
    return `rgb(${mix(0)}, ${mix(1)}, ${mix(2)})`;
  }

  protected hover(c: CorrelationCell): string {
    return c.r === null ? `${c.parameter} × ${c.chemistry}: not enough lots (n = ${c.n})` : `${c.parameter} × ${c.chemistry}: r = ${c.r.toFixed(3)}, p = ${c.p?.toPrecision(3)}, n = ${c.n}`;
  }

  protected choose(c: CorrelationCell): void {
    this.chosen.set(c);
  }

  protected readonly scatter = computed(() => {
    const s = this.study();
    const c = this.chosen() ?? [...s.cells].filter((x) => x.r !== null).sort((a, b) => Math.abs(b.r as number) - Math.abs(a.r as number))[0];
    if (!c) return null;
    const pts = s.lots.flatMap((l) => {
      const x = l.chemistry[c.chemistry];
      const y = l.parameters[c.parameter];
      return x === null || x === undefined || y === null || y === undefined ? [] : [{ lot: l.lotCode, x, y }];
    });
    if (!pts.length) return null;
    const ext = (vs: number[]) => {
      const lo = Math.min(...vs);
      const hi = Math.max(...vs);
      const m = (hi - lo || Math.abs(hi) || 1) * 0.08;
      return [lo - m, hi + m];
    };
    const [x0, x1] = ext(pts.map((p) => p.x));
    const [y0, y1] = ext(pts.map((p) => p.y));
    const X = (v: number) => P.left + ((v - x0) / (x1 - x0)) * (SW - P.left - P.right);
    const Y = (v: number) => SH - P.bottom - ((v - y0) / (y1 - y0)) * (SH - P.top - P.bottom);
    const chem = s.chemistry.find((f) => f.field === c.chemistry);
    const param = s.parameters.find((p) => p.name === c.parameter);
    const ticks = (lo: number, hi: number, at: (v: number) => number) => [0, 0.5, 1].map((f) => lo + (hi - lo) * f).map((v) => ({ at: at(v), text: fmt(v) }));
    return {
      xLabel: `${chem?.label ?? c.chemistry}${chem?.unit ? ` (${chem.unit})` : ''}`,
      yLabel: `${c.parameter}${param?.unit ? ` (${param.unit})` : ''}`,
      label: `${c.parameter} against ${chem?.label ?? c.chemistry}: ${c.r === null ? 'no r' : `r = ${c.r.toFixed(3)}, p = ${c.p?.toPrecision(3)}`}, n = ${c.n} lots.`,
      xTicks: ticks(x0, x1, X),
      yTicks: ticks(y0, y1, Y),
      dots: pts.map((p) => ({ lot: p.lot, x: X(p.x), y: Y(p.y), title: `${p.lot}: ${fmt(p.x)}, ${fmt(p.y)}` })),
    };
  });
}
