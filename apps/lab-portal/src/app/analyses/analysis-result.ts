import { DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Analysis } from '@ohmprint/contracts';
import { BodeChart, DistanceHistogram, LibraryMap, NyquistChart, ScreeningCaution, VerdictChip, formatNumber, type DistanceHistogramInput, type MapPoint, type ReferenceBand, type SpectrumSeries } from '@ohmprint/ui';
import { modelLabel } from '@ohmprint/spectral-engine';
import { AnalysesData } from './analyses-data';
import { referenceBandOf } from './reference-band';
import { temperatureText } from './temperature-text';

/** Everything behind a verdict, read-only: shared by the analyst's tab and the reviewer's page. */
@Component({
  selector: 'ohm-analysis-result',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, PercentPipe, MatIconModule, VerdictChip, BodeChart, NyquistChart, DistanceHistogram, LibraryMap, ScreeningCaution],
  templateUrl: './analysis-result.html',
  styleUrl: './analysis-result.scss',
})
export class AnalysisResult {
  private readonly data = inject(AnalysesData);
  readonly analysis = input.required<Analysis>();

  /** Null until the lots arrive (or if they cannot): the plots then show the sample alone. */
  protected readonly band = signal<ReferenceBand | null>(null);
  private readonly versionId = computed(() => this.analysis().libraryVersion.id);
  protected readonly sampleSeries = computed<SpectrumSeries[]>(() => [{ label: `Sample ${this.analysis().sample.code} (replicate mean)`, ...this.analysis().sampleSpectrum }]);

  constructor() {
    effect((onCleanup) => {
      this.band.set(null);
      const sub = this.data.referenceSpectra(this.versionId()).subscribe((spectra) => this.band.set(referenceBandOf(spectra)));
      onCleanup(() => sub.unsubscribe());
    });
  }

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
  protected readonly sortedDistances = computed(() => [...this.result().distances].sort((a, b) => a.distance - b.distance));
  protected readonly ruleText = computed(() => {
    const m = this.analysis().method;
    const lo = Math.round(m.lowerQuantile * 100);
    const hi = Math.round(m.upperQuantile * 100);
    return `Nearest distance ≤ T${lo} → consistent with the reference library; between T${lo} and T${hi} → inconclusive; above T${hi} → not consistent. Fewer than ${m.minimumLots} lots → no verdict.`;
  });
}
