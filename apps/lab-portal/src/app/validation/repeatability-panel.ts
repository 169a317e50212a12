import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { RepeatabilityStudy } from '@ohmprint/contracts';

const W = 720;
const H = 240;
const P = { left: 56, right: 16, top: 12, bottom: 40 };
const num = (v: number | null) => (v === null ? '–' : v.toPrecision(3));

/** Replicate distances within samples against distances between lots, on shared log bins. */
@Component({
  selector: 'ohm-repeatability-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @let r = study();
    <dl class="figures">
      <div><dt>Replicates within a sample</dt><dd>{{ r.within.count }} pairs in {{ r.within.samples }} samples · median {{ num(r.within.median) }} · 95th percentile {{ num(r.within.p95) }}@if (r.synthesisedForDemo) { · includes invented demo sweeps }</dd></div>
      <div><dt>Pairs of reference lots</dt><dd>{{ r.between.count }} pairs · median {{ num(r.between.median) }} · 5th percentile {{ num(r.between.p5) }}</dd></div>
      <div><dt>Lots differ from each other</dt><dd>{{ r.ratio === null ? '–' : r.ratio.toPrecision(3) + ' times more than replicates (medians)' }}</dd></div>
    </dl>
    @if (layout(); as l) {
      <svg role="img" [attr.viewBox]="'0 0 ' + w + ' ' + h" [attr.aria-label]="'Histogram: ' + r.within.count + ' replicate distances and ' + r.between.count + ' lot distances on a log scale'">
 <defs>
          <pattern id="ohm-between-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect class="hatch-bg" width="6" height="6" /><line class="hatch" x1="0" y1="0" x2="0" y2="6" />
          </pattern>
        </defs>
        <rect class="frame" [attr.x]="pad.left" [attr.y]="pad.top" [attr.width]="w - pad.left - pad.right" [attr.height]="h - pad.top - pad.bottom" />
        @for (b of l.bars; track $index) {
          <rect [class]="'bar ' + b.kind" [attr.x]="b.x" [attr.y]="b.y" [attr.width]="b.w" [attr.height]="b.h"><title>{{ b.title }}</title></rect>
        }
        @for (t of l.ticks; track $index) { <text class="tick" [attr.x]="t.x" [attr.y]="h - pad.bottom + 14" text-anchor="middle">{{ t.text }}</text> }
        <text class="tick" [attr.x]="pad.left - 4" [attr.y]="pad.top + 10" text-anchor="end">{{ l.max }}</text>
        <text class="tick" [attr.x]="pad.left - 4" [attr.y]="h - pad.bottom" text-anchor="end">0</text>
        <text class="axis" [attr.x]="pad.left + (w - pad.left - pad.right) / 2" [attr.y]="h - 6" text-anchor="middle">Distance (log scale)</text>
        <text class="axis" [attr.transform]="'translate(14,' + (h / 2) + ') rotate(-90)'" text-anchor="middle">Pairs</text>
      </svg>
      <p class="legend"><span class="key within"></span>replicates within a sample <span class="key between"></span>pairs of lots (hatched)</p>
    } @else {
      <p>No replicate or lot distances yet: measure samples of this product with at least two replicates.</p>
    }
  `,
  styles: `
    .figures { display: grid; gap: 4px; margin: 0 0 12px; }
    .figures div { display: flex; gap: 8px; flex-wrap: wrap; }
    dt { font-weight: 600; }
    dd { margin: 0; }
    svg { width: 100%; max-width: 900px; height: auto; font: 11px Inter, sans-serif; }
    .frame { fill: none; stroke: var(--mat-sys-outline); }
    .tick, .axis { fill: var(--mat-sys-on-surface-variant); }
    .bar.within { fill: var(--mat-sys-primary); }
    .bar.between { fill: url(#ohm-between-hatch); }
    .hatch-bg { fill: var(--mat-sys-tertiary); }
    .hatch { stroke: var(--mat-sys-surface); stroke-width: 2; }
    .legend { display: flex; gap: 14px; align-items: center; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .key { display: inline-block; width: 12px; height: 12px; margin-right: -8px; }
    .key.within { background: var(--mat-sys-primary); }
    .key.between { background: repeating-linear-gradient(45deg, var(--mat-sys-tertiary) 0 3px, var(--mat-sys-surface) 3px 5px); }
  `,
})
export class RepeatabilityPanel {
  readonly study = input.required<RepeatabilityStudy>();
  protected readonly w = W;
  protected readonly h = H;
  protected readonly pad = P;
  protected readonly num = num;

  protected readonly layout = computed(() => {
    const hist = this.study().histogram;
    if (!hist.edges.length) return null;
    const max = Math.max(1, ...hist.within, ...hist.between);
    const lo = Math.log10(hist.edges[0]);
    const hi = Math.log10(hist.edges[hist.edges.length - 1]);
    const X = (v: number) => P.left + ((Math.log10(v) - lo) / (hi - lo || 1)) * (W - P.left - P.right);
    const Y = (n: number) => H - P.bottom - (n / max) * (H - P.top - P.bottom);
    const bars = hist.within.flatMap((n, i) => {
      const x0 = X(hist.edges[i]);
      const half = (X(hist.edges[i + 1]) - x0) / 2;
      const range = `${hist.edges[i].toPrecision(2)}–${hist.edges[i + 1].toPrecision(2)}`;
      return [
        ...(n ? [{ kind: 'within', x: x0, y: Y(n), w: Math.max(half - 0.5, 0.5), h: H - P.bottom - Y(n), title: `${n} replicate pairs, ${range}` }] : []),
        ...(hist.between[i] ? [{ kind: 'between', x: x0 + half, y: Y(hist.between[i]), w: Math.max(half - 0.5, 0.5), h: H - P.bottom - Y(hist.between[i]), title: `${hist.between[i]} lot pairs, ${range}` }] : []),
      ];
    });
    const ticks = [];
    for (let e = Math.floor(lo); e <= Math.ceil(hi); e++) {
      for (const m of [1, 2, 5]) {
        const v = m * 10 ** e;
        if (Math.log10(v) >= lo && Math.log10(v) <= hi) ticks.push({ x: X(v), text: String(Number(v.toPrecision(1))) });
      }
    }
    return { bars, ticks, max };
  });
}
