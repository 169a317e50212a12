import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { RouterLink } from '@angular/router';
import { MATRIX_LABELS, type CustodyEvent, type SampleDetail } from '@ohmprint/contracts';
import { SampleStateChip, Session } from '@ohmprint/ui';
import { AnalysisPanel } from '../analyses/analysis-panel';
import { CustodyTimeline } from '../intake/custody-timeline';
import { IntakeData } from '../intake/intake-data';
import { IntakePhotos } from '../intake/intake-photos';
import { MeasurementsPanel } from '../measurements/measurements-panel';

/** One sample, for everyone in the lab: order, intake, custody, measurements and analysis. */
@Component({
  selector: 'ohm-sample-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatCardModule, MatProgressBarModule, MatTabsModule, SampleStateChip, CustodyTimeline, IntakePhotos, MeasurementsPanel, AnalysisPanel],
  templateUrl: './sample-page.html',
  styleUrl: './sample-page.scss',
})
export class SamplePage {
  protected readonly matrixLabel = MATRIX_LABELS;
  private readonly data = inject(IntakeData);
  private readonly session = inject(Session);
  /** Route parameter, bound by withComponentInputBinding. */
  readonly id = input.required<string>();

  protected readonly sample = signal<SampleDetail | null>(null);
  protected readonly custody = signal<readonly CustodyEvent[]>([]);
  protected readonly isAnalyst = computed(() => this.session.hasAnyRole(['analyst']));
  /** A reported sample is worked on again once its report is revoked (the API checks this too). */
  protected readonly canMeasure = computed(() => {
    const s = this.sample();
    const open = ['accepted', 'measuring', 'analysed', 'returned-for-rework'].includes(s?.state ?? '');
    return this.isAnalyst() && (open || (s?.state === 'reported' && !!s.revokedReport));
  });

  constructor() {
    effect(() => this.reload(this.id()));
  }

  protected reload(id: string): void {
    this.data.sample(id).subscribe((s) => this.sample.set(s));
    this.data.custody(id).subscribe((t) => this.custody.set(t.events));
  }

  protected custodyRecorded(e: CustodyEvent): void {
    this.custody.update((list) => [...list, e]);
  }
}
