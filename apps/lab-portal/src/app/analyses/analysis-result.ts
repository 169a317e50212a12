import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { describeWithoutSymbol, typicalityText, weightingExplained, weightingText, type Analysis } from '@ohmprint/contracts';
import { ParameterSymbol, Quantity, BodeChart, DistanceHistogram, FitResidualChart, LibraryMap, NyquistChart, fitResiduals, ScreeningCaution, VerdictChip, type DistanceHistogramInput, type MapPoint, type ReferenceBand, type SpectrumSeries } from '@ohmprint/ui';
import { modelLabel } from '@ohmprint/spectral-engine';
import { LotDistancePager } from './lot-distance-pager';
import { referenceBandOf } from './reference-band';
import { temperatureText } from './temperature-text';

const NEAREST_SHOWN = 10;

/** Everything behind a verdict, read-only: shared by the analyst's tab and the reviewer's page. */
@Component({
  selector: 'ohm-analysis-result',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, MatIconModule, MatTooltipModule, VerdictChip, BodeChart, NyquistChart, DistanceHistogram, LibraryMap, FitResidualChart, ScreeningCaution, LotDistancePager, Quantity, ParameterSymbol],
  templateUrl: './analysis-result.html',
  styleUrl: './analysis-result.scss',
})
export class AnalysisResult {
  readonly analysis = input.required<Analysis>();

  /** The version's band as stored at publication and returned with the analysis; without one the plots show the sample alone. */
  protected readonly band = computed<ReferenceBand | null>(() => referenceBandOf(this.analysis().referenceBand));
  protected readonly sampleSeries = computed<SpectrumSeries[]>(() => [{ label: `Sample ${this.analysis().sample.code} (replicate mean)`, ...this.analysis().sampleSpectrum }]);

  /** Significant digits, not decimals: fitted time constants run to microseconds. */
  protected readonly describeWithoutSymbol = describeWithoutSymbol;
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
  /** The sample, with the fitted model's curve over it when the analysis has one. */
  protected readonly plottedSeries = computed<SpectrumSeries[]>(() => {
    const fit = this.result().fit;
    const sample = this.sampleSeries();
    if (!fit?.curve || fit.curve.re.length !== this.analysis().sampleSpectrum.frequencyHz.length) return sample;
    const curve: SpectrumSeries = { label: `Fitted ${modelLabel(fit.model)} model`, frequencyHz: this.analysis().sampleSpectrum.frequencyHz, re: fit.curve.re, im: fit.curve.im, role: 'fit' };
    return [...sample, curve];
  });
  protected readonly fitNote = computed(() => (this.plottedSeries().some((s) => s.role === 'fit') ? ', with the fitted model' : ''));
  protected readonly residuals = computed(() => {
    const curve = this.result().fit?.curve;
    return curve ? fitResiduals(this.analysis().sampleSpectrum, curve) : null;
  });
  protected readonly typicalityText = computed(() => typicalityText(this.result().typicality));
  protected readonly weightingText = weightingText;
  protected readonly weightingExplained = weightingExplained;
  protected producerCode(lotId: string): string | null {
    return this.analysis().producerLotCodes?.[lotId] ?? null;
  }
  protected readonly nearestProducerCode = computed(() => {
    const n = this.result().nearest;
    return n ? this.producerCode(n.lotId) : null;
  });
  protected readonly claimedLotText = computed(() => {
    const claim = this.analysis().claimedLot;
    const nearest = this.result().nearest;
    if (!claim) return null;
    const said = `The client claimed the producer's lot ${claim.lotCode}`;
    if (!nearest) return `${said}; there is no nearest lot to compare it with.`;
    const producer = this.nearestProducerCode();
    if (claim.nearestIsClaimed === null || !producer) return `${said}; the nearest lot ${nearest.lotCode} has no producer's lot code, so they cannot be compared.`;
    return claim.nearestIsClaimed
      ? `${said}; the nearest lot ${nearest.lotCode} is that lot (producer's ${producer}).`
      : `${said}; the nearest lot ${nearest.lotCode} is not that lot (it is the producer's ${producer}).`;
  });
  protected readonly ruleText = computed(() => {
    const m = this.analysis().method;
    const lo = Math.round(m.lowerQuantile * 100);
    const hi = Math.round(m.upperQuantile * 100);
    return `Nearest distance ≤ T${lo} → consistent with the reference library; between T${lo} and T${hi} → inconclusive; above T${hi} → not consistent. Fewer than ${m.minimumLots} lots → no verdict.`;
  });
}
