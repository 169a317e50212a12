import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { FormControl, FormsModule, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import type { Analysis, AnalysisRun, LibraryItem, SampleDetail } from '@ohmprint/contracts';
import { switchMap, takeWhile, timer, type Subscription } from 'rxjs';
import { ApiProblem, Notice, Notifier } from '@ohmprint/ui';
import { AnalysesData } from './analyses-data';
import { AnalysisResult } from './analysis-result';
import { analysisStatusLabel } from './analysis-status-label';

/** The analysis tab: pick a published library version, run, read the result, remark, submit. */
@Component({
  selector: 'ohm-analysis-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule, Notice, AnalysisResult],
  templateUrl: './analysis-panel.html',
  styles: `
    .run { display: flex; flex-wrap: wrap; gap: 12px; align-items: baseline; }
    .run mat-form-field { width: min(480px, 100%); }
    .history { display: flex; flex-wrap: wrap; gap: 8px; margin: 8px 0 16px; }
    .history button.current { outline: 2px solid var(--mat-sys-primary); }
    .remarks { width: 100%; }
    .buttons { display: flex; gap: 8px; margin-bottom: 16px; }
    .review { border-left: 3px solid var(--mat-sys-outline); padding-left: 12px; margin: 8px 0; }
  `,
})
export class AnalysisPanel {
  private readonly data = inject(AnalysesData);
  private readonly notifier = inject(Notifier);
  readonly sample = input.required<SampleDetail>();
  readonly canEdit = input(false);
  readonly changed = output<void>();

  protected readonly statusLabel = analysisStatusLabel;
  protected readonly library = signal<LibraryItem | null>(null);
  protected readonly libraryLoaded = signal(false);
  protected readonly versionId = signal<string | null>(null);
  protected readonly history = signal<{ id: string; createdAt: string; status: Analysis['status']; verdict: Analysis['result']['verdict'] }[]>([]);
  protected readonly current = signal<Analysis | null>(null);
  protected readonly running = signal(false);
  protected readonly runError = signal<string | null>(null);
  /** An analysis against a large library on a worker, polled every second while queued or running. */
  protected readonly waiting = signal<AnalysisRun | null>(null);
  private polling: Subscription | null = null;
  protected readonly submitting = signal(false);
  protected readonly remarks = new FormControl('', { nonNullable: true });
  protected readonly published = computed(() => (this.library()?.versions ?? []).filter((v) => v.status === 'published').sort((a, b) => b.version - a.version));
  protected readonly editable = computed(() => this.canEdit() && ['draft', 'returned'].includes(this.current()?.status ?? ''));

  /**
   * Keyed on the id: the sample page reloads the sample after every run and submission, and
   * reopening the newest analysis then would overwrite remarks the analyst is already typing.
   */
  private readonly sampleId = computed(() => this.sample().id);

  constructor() {
    effect(() => {
      this.sampleId();
      const s = untracked(this.sample);
      this.data.libraryFor(s.product.id, s.product.name).subscribe((lib) => {
        this.library.set(lib);
        this.libraryLoaded.set(true);
        this.versionId.set(this.published()[0]?.id ?? null);
      });
      this.loadHistory(s.id, true);
      // an analysis asked for earlier may still be on a worker
      this.follow(s.id, false);
    });
    inject(DestroyRef).onDestroy(() => this.polling?.unsubscribe());
  }

  protected open(id: string): void {
    this.data.get(id).subscribe((a) => {
      this.current.set(a);
      this.remarks.setValue(a.remarks);
    });
  }

  protected run(): void {
    const versionId = this.versionId();
    if (!versionId) return;
    this.running.set(true);
    this.runError.set(null);
    this.data.run(this.sample().id, versionId).subscribe({
      next: (r) => {
        if ('run' in r) {
          this.waiting.set(r.run);
          this.follow(this.sample().id, true);
          return;
        }
        const a = r.analysis;
        this.running.set(false);
        this.current.set(a);
        this.remarks.setValue(a.remarks);
        this.loadHistory(this.sample().id, false);
        this.changed.emit();
      },
      error: (e: unknown) => {
        this.running.set(false);
        this.runError.set(ApiProblem.from(e).summary);
      },
    });
  }

  /** Polls the sample's analysis on a worker until it is done (then opens it) or failed (then says why). */
  private follow(sampleId: string, asked: boolean): void {
    this.polling?.unsubscribe();
    let seenBusy = asked;
    this.polling = timer(0, 1000)
      .pipe(
        switchMap(() => this.data.analysisRun(sampleId)),
        takeWhile((r) => r.state === 'queued' || r.state === 'running', true),
      )
      .subscribe({
        next: (r) => {
          const busy = r.state === 'queued' || r.state === 'running';
          this.waiting.set(busy ? r : null);
          if (busy) {
            seenBusy = true;
            this.running.set(true);
            return;
          }
          // on opening the page, only a run seen on the worker is reported
          if (!seenBusy) return;
          this.running.set(false);
          if (r.state === 'done' && r.analysisId) {
            this.open(r.analysisId);
            this.loadHistory(sampleId, false);
            this.changed.emit();
          } else if (r.state === 'failed') {
            this.runError.set(r.detail ?? 'The analysis failed.');
          }
        },
        error: (e: unknown) => {
          this.running.set(false);
          this.waiting.set(null);
          this.runError.set(ApiProblem.from(e).summary);
        },
      });
  }

  protected saveRemarks(): void {
    const a = this.current();
    if (!a) return;
    this.data.saveRemarks(a.id, this.remarks.value).subscribe((saved) => {
      this.current.set(saved);
      this.notifier.success('Remarks saved.');
    });
  }

  protected submit(): void {
    const a = this.current();
    if (!a) return;
    this.submitting.set(true);
    this.data.saveRemarks(a.id, this.remarks.value).subscribe({
      next: () =>
        this.data.submit(a.id).subscribe({
          next: (submitted) => {
            this.submitting.set(false);
            this.current.set(submitted);
            this.notifier.success(`Analysis of ${submitted.sample.code} submitted for review.`);
            this.loadHistory(this.sample().id, false);
            this.changed.emit();
          },
          error: (e: unknown) => {
            this.submitting.set(false);
            this.notifier.problem(ApiProblem.from(e));
          },
        }),
      error: () => this.submitting.set(false),
    });
  }

  private loadHistory(sampleId: string, openNewest: boolean): void {
    this.data.forSample(sampleId).subscribe((page) => {
      this.history.set(page.items.map((i) => ({ id: i.id, createdAt: i.createdAt, status: i.status, verdict: i.verdict })));
      if (openNewest && page.items[0]) this.open(page.items[0].id);
    });
  }
}
