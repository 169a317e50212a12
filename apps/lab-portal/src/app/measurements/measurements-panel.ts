import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { ReferenceBandView, Replicate, SampleMeasurements, SpectrumPoints } from '@ohmprint/contracts';
import { BodeChart, KkResidualChart, NyquistChart, Notice, Session, formatHz, type KkResiduals, type SpectrumSeries } from '@ohmprint/ui';
import { EMPTY, forkJoin, of, switchMap } from 'rxjs';
import { AnalysesData } from '../analyses/analyses-data';
import { referenceBandOf } from '../analyses/reference-band';
import { ExcludeDialog, type ExcludeRequest } from './exclude-dialog';
import { kkResiduals } from './kk-residuals';
import { MeasurementUpload } from './measurement-upload';
import { MeasurementsData } from './measurements-data';
import { normalisedReplicates } from './normalised-replicates';
import { ReplicateSources } from './replicate-sources';

/** The measurements tab of a sample: upload, the replicates overlaid, their checks, and exclusions. */
@Component({
  selector: 'ohm-measurements-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, MatButtonModule, MatIconModule, MatProgressBarModule, BodeChart, NyquistChart, KkResidualChart, Notice, MeasurementUpload, ReplicateSources],
  templateUrl: './measurements-panel.html',
  styleUrl: './measurements-panel.scss',
})
export class MeasurementsPanel {
  private readonly data = inject(MeasurementsData);
  private readonly dialog = inject(MatDialog);
  private readonly analyses = inject(AnalysesData);
  private readonly session = inject(Session);
  readonly sampleId = input.required<string>();
  /** The sample's product: its newest published library version gives the reference band. */
  readonly product = input<{ readonly id: string; readonly name: string } | null>(null);
  /** Analysts may upload and exclude; others look. */
  readonly canEdit = input(false);
  /** Uploads and exclusions move the sample's state; the page refreshes its header. */
  readonly changed = output<void>();

  protected readonly hz = formatHz;
  protected readonly measurements = signal<SampleMeasurements | null>(null);
  protected readonly spectra = signal<ReadonlyMap<string, SpectrumPoints>>(new Map());
  protected readonly selected = signal<string | null>(null);
  protected readonly residuals = signal<KkResiduals | null>(null);
  protected readonly residualsMissing = signal(false);
  protected readonly loading = signal(true);

  protected readonly reference = signal<ReferenceBandView | null>(null);
  private readonly rawSeries = computed(() => {
    const m = this.measurements();
    if (!m) return [];
    return m.replicates.flatMap((r) => {
      const s = this.spectra().get(r.id);
      return s ? [{ label: `Replicate ${r.replicateNumber}`, ...s, muted: r.excluded, cellConstantPerCm: r.cellConstantPerCm, temperatureC: r.temperatureC }] : [];
    });
  });
  /** As measured (Ω) until a reference version is known; then normalised like its lots (Ω·cm). */
  protected readonly series = computed<SpectrumSeries[]>(() => {
    const ref = this.reference();
    return ref ? normalisedReplicates(this.rawSeries(), ref) : this.rawSeries();
  });
  protected readonly band = computed(() => {
    const ref = this.reference();
    return ref ? referenceBandOf(ref.band) : null;
  });
  protected readonly unit = computed(() => (this.reference() ? 'Ω·cm' : 'Ω'));
  protected readonly plotNote = computed(() => {
    const ref = this.reference();
    return ref ? `, normalised to ${ref.referenceTemperatureC} °C, against ${ref.productName} library version ${ref.version}` : ', as measured';
  });
  protected readonly selectedReplicate = computed(() => this.measurements()?.replicates.find((r) => r.id === this.selected()) ?? null);

  constructor() {
    effect(() => this.load(this.sampleId()));
    effect((onCleanup) => {
      const product = this.product();
      this.reference.set(null);
      // Intake technicians see the replicates but not the libraries.
      if (!product || !this.session.hasAnyRole(['analyst', 'reviewer', 'lab-admin'])) return;
      const sub = this.analyses
        .libraryFor(product.id, product.name)
        .pipe(
          switchMap((lib) => {
            const newest = (lib?.versions ?? []).filter((v) => v.status === 'published').sort((a, b) => b.version - a.version)[0];
            return newest ? this.analyses.referenceBand(newest.id) : EMPTY;
          }),
        )
        .subscribe((ref) => this.reference.set(ref));
      onCleanup(() => sub.unsubscribe());
    });
  }

  protected load(sampleId: string): void {
    this.loading.set(true);
    this.data.forSample(sampleId).subscribe((m) => {
      this.measurements.set(m);
      this.loading.set(false);
      const missing = m.replicates.filter((r) => !this.spectra().has(r.id));
      const wanted = missing.length ? forkJoin(Object.fromEntries(missing.map((r) => [r.id, this.data.spectrum(sampleId, r.id)]))) : of({});
      wanted.subscribe((got: Record<string, SpectrumPoints>) => {
        this.spectra.update((cur) => new Map([...cur, ...Object.entries(got)]));
        const first = m.replicates.find((r) => r.id === this.selected()) ?? m.replicates[0];
        if (first) this.select(first);
      });
    });
  }

  protected select(r: Replicate): void {
    this.selected.set(r.id);
    const spectrum = this.spectra().get(r.id);
    this.residualsMissing.set(!spectrum);
    this.residuals.set(spectrum ? kkResiduals(spectrum, r.kramersKronig) : null);
  }

  protected exclude(r: Replicate): void {
    this.dialog
      .open<ExcludeDialog, ExcludeRequest, SampleMeasurements>(ExcludeDialog, { data: { sampleId: this.sampleId(), replicate: r } })
      .afterClosed()
      .subscribe((updated) => {
        if (updated) {
          this.measurements.set(updated);
          this.changed.emit();
        }
      });
  }
}
