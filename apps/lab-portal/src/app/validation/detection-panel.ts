import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { DetectionStudy } from '@ohmprint/contracts';

/** Per admixture and level: the share of trials in each verdict, as stacked bars with numbers. */
@Component({
  selector: 'ohm-detection-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    @let d = study();
    <p class="ohm-muted">{{ d.detectionRule }}</p>
    @if (d.synthesisedForDemo) { <p class="demo"><mat-icon aria-hidden="true">science</mat-icon>Includes invented trials synthesised for the demo.</p> }
    @for (s of d.series; track s.admixture + s.admixtureName) {
      <section>
        <h3>{{ s.admixture === 'water' ? 'Watered' : 'Blended' }} with {{ s.admixtureName }}</h3>
        <p class="lowest">
          @if (s.lowestReliableLevelPercent !== null) { <mat-icon aria-hidden="true">track_changes</mat-icon>Lowest level reliably detected: <strong>{{ s.lowestReliableLevelPercent }} %</strong> }
          @else { <mat-icon aria-hidden="true">help</mat-icon>No level is reliably detected yet. }
        </p>
        <table class="levels">
          <caption class="cdk-visually-hidden">Verdicts per level, {{ s.admixtureName }}</caption>
          <thead><tr><th scope="col">Level</th><th scope="col">Trials</th><th scope="col">Verdicts</th><th scope="col">Not consistent</th><th scope="col">Inconclusive</th><th scope="col">Consistent</th></tr></thead>
          <tbody>
            @for (l of s.levels; track l.levelPercent) {
              <tr>
                <th scope="row">{{ l.levelPercent }} %</th>
                <td>{{ l.total }}</td>
                <td class="bar-cell">
                  <div class="bar" aria-hidden="true">
                    <span class="nc" [style.width.%]="100 * l.counts.notConsistent / l.total"></span>
                    <span class="inc" [style.width.%]="100 * l.counts.inconclusive / l.total"></span>
                    <span class="ok" [style.width.%]="100 * l.counts.consistent / l.total"></span>
                  </div>
                </td>
                <td>{{ share(l.counts.notConsistent, l.total) }}@if (l.reliablyDetected) { <mat-icon class="tick" aria-label="reliably detected">check</mat-icon> }</td>
                <td>{{ share(l.counts.inconclusive, l.total) }}</td>
                <td>{{ share(l.counts.consistent, l.total) }}</td>
              </tr>
            }
          </tbody>
        </table>
      </section>
    } @empty {
      <p>No deliberate mixtures recorded for {{ d.productName }} yet. Mark a sample as a mixture (its level and what was added) below; its verdict joins this study.</p>
    }
    <p class="legend"><span class="key nc"></span>not consistent <span class="key inc"></span>inconclusive <span class="key ok"></span>consistent</p>
  `,
  styles: `
    h3 { font: var(--mat-sys-title-small); margin: 16px 0 4px; }
    .demo, .lowest { display: flex; gap: 6px; align-items: center; margin: 4px 0; }
    .levels { border-collapse: collapse; width: 100%; max-width: 900px; }
    .levels th, .levels td { text-align: left; padding: 4px 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .bar-cell { width: 40%; }
    .bar { display: flex; height: 16px; border-radius: 4px; overflow: hidden; background: var(--mat-sys-surface-container-high); }
    .nc { background: var(--ohm-verdict-not-consistent-mark); }
    .inc { background: var(--ohm-verdict-inconclusive-mark); }
    .ok { background: var(--ohm-verdict-consistent-mark); }
    .tick { width: 18px; height: 18px; font-size: 18px; vertical-align: middle; }
    .legend { display: flex; gap: 14px; align-items: center; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .key { display: inline-block; width: 12px; height: 12px; margin-right: -8px; border-radius: 2px; }
  `,
})
export class DetectionPanel {
  readonly study = input.required<DetectionStudy>();
  protected share(n: number, total: number): string {
    return `${n} (${Math.round((100 * n) / total)} %)`;
  }
}
