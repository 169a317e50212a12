import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Analysis } from '@ohmprint/contracts';
import { BodeChart, DistanceHistogram, LibraryMap, NyquistChart, ScreeningCaution, VerdictChip, formatNumber, type DistanceHistogramInput, type MapPoint, type ReferenceBand, type SpectrumSeries } from '@ohmprint/ui';
import { modelLabel } from '@ohmprint/spectral-engine';
import { LotDistancePager } from './lot-distance-pager';
import { referenceBandOf } from './reference-band';
import { temperatureText } from './temperature-text';

const NEAREST_SHOWN = 10;

/** Everything behind a verdict, read-only: shared by the analyst's tab and the reviewer's page. */
@Component({
  selector: 'ohm-analysis-result',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, PercentPipe, MatIconModule, VerdictChip, BodeChart, NyquistChart, DistanceHistogram, LibraryMap, ScreeningCaution, LotDistancePager],
  templateUrl: './analysis-result.html',
  styleUrl: './analysis-result.scss',
})
export class AnalysisResult {
  readonly analysis = input.required<Analysis>();

  /** The version's band as stored at publication and returned with the analysis; without one the plots show the sample alone. */
  protected readonly band = computed<ReferenceBand | null>(() => referenceBandOf(this.analysis().referenceBand));
  protected readonly sampleSeries = computed<SpectrumSeries[]>(() => [{ label: `Sample ${this.analysis().sample.code} (replicate mean)`, ...this.analysis().sampleSpectrum }]);

  /** Significant digits, not decimals: fitted time constants run to microseconds. */
  protected readonly fmt = formatNumber;
  protected readonly modelLabel = modelLabel;
  protected readonly result = computed(() => this.analysis().result);
  protected readonly temperature = computed(() => temperatureText(this.analysis()));
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
  /** The ten nearest lots; the rest page through the lot-distances route on request. */
  protected readonly nearestLots = computed(() => [...this.result().distances].sort((a, b) => a.distance - b.distance).slice(0, NEAREST_SHOWN));
  protected readonly lotCount = computed(() => this.result().lotCount ?? this.result().distances.length);
  protected readonly ruleText = computed(() => {
    const m = this.analysis().method;
    const lo = Math.round(m.lowerQuantile * 100);
    const hi = Math.round(m.upperQuantile * 100);
    return `Nearest distance ≤ T${lo} → consistent with the reference library; between T${lo} and T${hi} → inconclusive; above T${hi} → not consistent. Fewer than ${m.minimumLots} lots → no verdict.`;
  });
}
