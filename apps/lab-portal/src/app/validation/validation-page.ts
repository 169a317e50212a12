import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute, Router } from '@angular/router';
import { map } from 'rxjs';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTabsModule } from '@angular/material/tabs';
import type { CorrelationStudy, DetectionStudy, OngoingPerformance, RepeatabilityStudy } from '@ohmprint/contracts';
import { EmptyState, ScreeningCaution } from '@ohmprint/ui';
import { CorrelationPanel } from './correlation-panel';
import { DetectionPanel } from './detection-panel';
import { PerformancePanel } from './performance-panel';
import { RepeatabilityPanel } from './repeatability-panel';
import { SampleFlagsForm } from './sample-flags-form';
import { ValidationData, type VersionChoice } from './validation-data';
import { ValidationFiles } from './validation-files';

/** Method validation of one library version: chemistry, repeatability, detection and blind checks. */
@Component({
  selector: 'ohm-validation-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatProgressBarModule, MatSelectModule, MatTabsModule, EmptyState, ScreeningCaution, CorrelationPanel, DetectionPanel, PerformancePanel, RepeatabilityPanel, SampleFlagsForm],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Method validation</h1>
        <p>Evidence for the lab's validation file: how the fitted parameters follow the chemistry, how well replicates agree, which deliberate changes the method catches, and how authentic lots sent blind are called.</p>
      </div>
    </header>
    @if (versions(); as vs) {
      @if (vs.length) {
        <div class="picker">
          <mat-form-field>
            <mat-label>Library version</mat-label>
            <mat-select [value]="chosen()?.versionId" (selectionChange)="choose($event.value)">
              @for (v of vs; track v.versionId) { <mat-option [value]="v.versionId">{{ v.label }}</mat-option> }
            </mat-select>
          </mat-form-field>
          @if (chosen(); as c) {
            <button mat-flat-button type="button" (click)="files.download('/api/lab/validation/library-versions/' + c.versionId + '/summary.pdf', 'validation-summary.pdf')"><mat-icon>picture_as_pdf</mat-icon>Validation summary (PDF)</button>
            <button mat-stroked-button type="button" (click)="files.download('/api/lab/validation/library-versions/' + c.versionId + '/correlation.csv', 'correlation.csv')"><mat-icon>download</mat-icon>Correlation (CSV)</button>
            <button mat-stroked-button type="button" (click)="files.download('/api/lab/validation/products/' + c.productId + '/detection.csv', 'detection-study.csv')"><mat-icon>download</mat-icon>Detection study (CSV)</button>
          }
        </div>
        <mat-tab-group mat-stretch-tabs="false" animationDuration="0ms">
          <mat-tab label="Parameters and chemistry">
            <div class="tab">@if (correlation(); as c) { <ohm-correlation-panel [study]="c" /> } @else { <mat-progress-bar mode="indeterminate" aria-label="Fitting the lots" /> }</div>
          </mat-tab>
          <mat-tab label="Repeatability">
            <div class="tab">@if (repeatability(); as r) { <ohm-repeatability-panel [study]="r" /> } @else { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }</div>
          </mat-tab>
          <mat-tab label="Detection study">
            <div class="tab">
              @if (detection(); as d) { <ohm-detection-panel [study]="d" /> } @else { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }
              <ohm-sample-flags-form (saved)="reloadStudies()" />
            </div>
          </mat-tab>
          <mat-tab label="Blind checks">
            <div class="tab">
              @if (performance(); as p) { <ohm-performance-panel [perf]="p" /> } @else { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }
              <ohm-sample-flags-form (saved)="reloadStudies()" />
            </div>
          </mat-tab>
        </mat-tab-group>
      } @else {
        <ohm-empty-state icon="library_books" heading="No published library version yet"><p>Validation works on a published library version: publish one first.</p></ohm-empty-state>
      }
    }
    <ohm-screening-caution class="caution" />
  `,
  styles: `
    .picker { display: flex; flex-wrap: wrap; gap: 8px 12px; align-items: baseline; }
    .picker mat-form-field { width: min(520px, 100%); }
    .tab { padding: 16px 4px; }
    .caution { margin-top: 24px; }
  `,
})
export class ValidationPage {
  private readonly data = inject(ValidationData);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  protected readonly files = inject(ValidationFiles);
  protected readonly versions = toSignal(this.data.versions());
  /** The version named in the address (`?version=`), so a link or a reload opens that version's studies. */
  private readonly chosenId = toSignal(this.route.queryParamMap.pipe(map((q) => q.get('version'))), { initialValue: null });
  protected readonly chosen = computed<VersionChoice | null>(() => {
    const vs = this.versions() ?? [];
    return vs.find((v) => v.versionId === this.chosenId()) ?? vs[0] ?? null;
  });
  protected readonly correlation = signal<CorrelationStudy | null>(null);
  protected readonly repeatability = signal<RepeatabilityStudy | null>(null);
  protected readonly detection = signal<DetectionStudy | null>(null);
  protected readonly performance = signal<OngoingPerformance | null>(null);
  private loadedFor: string | null = null;

  constructor() {
    // Loads once the versions arrive, and again whenever another version is chosen.
    effect(() => {
      const c = this.chosen();
      if (c && c.versionId !== this.loadedFor) untracked(() => this.load(c));
    });
  }

  protected choose(versionId: string): void {
    void this.router.navigate([], { relativeTo: this.route, queryParams: { version: versionId }, queryParamsHandling: 'merge', replaceUrl: true });
  }

  protected reloadStudies(): void {
    const c = this.chosen();
    if (!c) return;
    this.data.detection(c.productId).subscribe((d) => this.detection.set(d));
    this.data.performance().subscribe((p) => this.performance.set(p));
  }

  private load(c: VersionChoice): void {
    this.loadedFor = c.versionId;
    this.correlation.set(null);
    this.repeatability.set(null);
    this.detection.set(null);
    this.data.correlation(c.versionId).subscribe((x) => this.correlation.set(x));
    this.data.repeatability(c.versionId).subscribe((x) => this.repeatability.set(x));
    this.reloadStudies();
  }
}
