import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { OngoingPerformance } from '@ohmprint/contracts';
import { Notice, VerdictChip } from '@ohmprint/ui';

/** Authentic lots sent blind: how often the method called them not consistent, against its promise. */
@Component({
  selector: 'ohm-performance-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatIconModule, Notice, VerdictChip],
  template: `
    @let p = perf();
    @if (p.warning) {
      <ohm-notice tone="error" icon="warning"><p>{{ p.warning }}</p></ohm-notice>
    } @else if (p.total) {
      <ohm-notice tone="success" icon="check_circle"><p>No drift: the rate of “not consistent” on authentic lots is within what the decision rule allows.</p></ohm-notice>
    }
    <dl class="figures">
      <div><dt>Blind checks with a verdict</dt><dd>{{ p.total }}</dd></div>
      <div><dt>Called not consistent</dt><dd>{{ p.notConsistent }} ({{ rate(p.observedRate) }})</dd></div>
      <div><dt>The decision rule promises at most</dt><dd>{{ rate(p.promisedRate) }} (above T99)</dd></div>
      <div><dt>p-value</dt><dd>{{ p.pValue === null ? '–' : p.pValue.toPrecision(3) }}</dd></div>
    </dl>
    <p class="ohm-muted">{{ p.test }}</p>
    @if (p.checks.length) {
      <table class="checks">
        <caption class="cdk-visually-hidden">Blind checks, newest first</caption>
        <thead><tr><th scope="col">When</th><th scope="col">Sample</th><th scope="col">Product</th><th scope="col">Verdict</th></tr></thead>
        <tbody>
          @for (c of p.checks.slice(0, 30); track c.reference + c.at) {
            <tr><td>{{ c.at | date: 'd MMM y' }}</td><td>{{ c.reference }}@if (c.synthesisedForDemo) { <small> (demo)</small> }</td><td>{{ c.productName }}</td><td><ohm-verdict-chip [verdict]="$any(c.verdict)" /></td></tr>
          }
        </tbody>
      </table>
    } @else {
      <p>No blind checks yet. Re-submit an authentic reference lot as a routine sample and mark it as a blind check below.</p>
    }
  `,
  styles: `
    .figures { display: grid; grid-template-columns: repeat(auto-fit, minmax(200px, 1fr)); gap: 8px; margin: 12px 0; }
    dt { font: var(--mat-sys-label-large); color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; font: var(--mat-sys-title-medium); }
    .checks { border-collapse: collapse; width: 100%; max-width: 900px; }
    .checks th, .checks td { text-align: left; padding: 4px 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
  `,
})
export class PerformancePanel {
  readonly perf = input.required<OngoingPerformance>();
  protected rate(v: number | null): string {
    return v === null ? '–' : `${(v * 100).toFixed(1)} %`;
  }
}
