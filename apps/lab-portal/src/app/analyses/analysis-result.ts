import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Analysis } from '@ohmprint/contracts';
import { DistanceHistogram, LibraryMap, ScreeningCaution, VerdictChip, formatNumber, type DistanceHistogramInput, type MapPoint } from '@ohmprint/ui';

/** Everything behind a verdict, read-only: shared by the analyst's tab and the reviewer's page. */
@Component({
  selector: 'ohm-analysis-result',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, PercentPipe, MatIconModule, VerdictChip, DistanceHistogram, LibraryMap, ScreeningCaution],
  templateUrl: './analysis-result.html',
  styleUrl: './analysis-result.scss',
})
export class AnalysisResult {
  readonly analysis = input.required<Analysis>();

  /** Significant digits, not decimals: fitted time constants run to microseconds. */
  protected readonly fmt = formatNumber;
  protected readonly result = computed(() => this.analysis().result);
  protected readonly histogram = computed<DistanceHistogramInput>(() => {
    const r = this.result();
    return { calibrationDistances: [], t95: r.t95, t99: r.t99, sampleDistance: r.nearest?.distance ?? null, bins: r.histogram };
  });
  protected readonly mapPoints = computed<MapPoint[]>(() => {
    const m = this.result().map;
    return [
      ...m.lots.map((l): MapPoint => ({ id: l.lotId, label: l.lotCode, x: l.x, y: l.y, kind: 'reference' })),
      { id: 'sample', label: this.analysis().sample.code, x: m.sample[0], y: m.sample[1], kind: 'sample' },
    ];
  });
  protected readonly sortedDistances = computed(() => [...this.result().distances].sort((a, b) => a.distance - b.distance));
  protected readonly ruleText = computed(() => {
    const m = this.analysis().method;
    const lo = Math.round(m.lowerQuantile * 100);
    const hi = Math.round(m.upperQuantile * 100);
    return `Nearest distance ≤ T${lo} → consistent with the reference library; between T${lo} and T${hi} → inconclusive; above T${hi} → not consistent. Fewer than ${m.minimumLots} lots → no verdict.`;
  });
}
