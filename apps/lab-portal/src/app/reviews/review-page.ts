import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { Analysis, ApprovalResult, Replicate } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier, Session } from '@ohmprint/ui';
import { AnalysesData } from '../analyses/analyses-data';
import { AnalysisResult } from '../analyses/analysis-result';
import { MeasurementsPanel } from '../measurements/measurements-panel';
import { MeasurementsData } from '../measurements/measurements-data';
import { ReplicateSources } from '../measurements/replicate-sources';
import { ReportFiles } from '../reports/report-files';
import { analysisStatusLabel } from '../analyses/analysis-status-label';
import { filter, type Subscription } from 'rxjs';
import { followIssuance } from './follow-issuance';
import { ApprovalConfirmDialog, type ApprovalConfirmData } from './approval-confirm-dialog';
import { reviewRefusal } from './review-refusal';

/** The reviewer reads the analysis as submitted and approves (issuing the report) or returns it. */
@Component({
  selector: 'ohm-review-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, Notice, AnalysisResult, MeasurementsPanel, ReplicateSources],
  template: `
    @if (analysis(); as a) {
      <header class="ohm-page-header">
        <div>
          <h1>Review of <a class="code" [routerLink]="['/samples', a.sample.id]">{{ a.sample.code }}</a></h1>
          <p>Analysed by {{ a.analyst.displayName }} against {{ a.libraryVersion.productName }} library version {{ a.libraryVersion.version }}. Status: {{ statusText() }}.</p>
        </div>
      </header>
      @if (ownAnalysis()) {
        <ohm-notice tone="error" icon="group">You ran this analysis, so you cannot review it: a second person must (four-eyes rule).</ohm-notice>
      }
      @if (refusal(); as r) {
        <ohm-notice tone="error" icon="block">{{ r }}</ohm-notice>
      }
      <ohm-analysis-result [analysis]="a" />
      @if (replicates(); as reps) {
        <section aria-labelledby="files-heading">
          <h2 id="files-heading" class="title">Files behind this analysis and what each says about itself</h2>
          <ohm-replicate-sources [replicates]="reps" headingId="files-heading" />
        </section>
      }
      <details class="spectra">
        <summary>Measurements behind this analysis (spectra, Kramers–Kronig checks, exclusions)</summary>
        <ohm-measurements-panel [sampleId]="a.sample.id" [canEdit]="false" />
      </details>
      @if (a.remarks) {
        <h2 class="title">Analyst's remarks</h2>
        <p>{{ a.remarks }}</p>
      }
      @if (issuance(); as i) {
        @if (i.state === 'issued' && i.report; as report) {
          <ohm-notice tone="success" icon="verified">
            Report <strong>{{ report.number }}</strong> issued, signed and sent to the client.
            <button mat-button type="button" (click)="download(i)"><mat-icon>download</mat-icon>Download the PDF</button>
          </ohm-notice>
        } @else if (i.state === 'failed') {
          <ohm-notice tone="error" icon="error">
            {{ i.detail }}
            <button mat-button type="button" (click)="retry(a)"><mat-icon>refresh</mat-icon>Try issuing again</button>
          </ohm-notice>
        } @else {
          <section class="issuing" role="status" aria-live="polite">
            <p><strong>Issuing report…</strong> Approved. The report is being numbered, rendered, signed and e-mailed to the client; you may leave this page, it carries on.</p>
            <mat-progress-bar mode="indeterminate" aria-label="Issuing the report" />
          </section>
        }
      } @else if (a.status === 'submitted') {
        <section class="decide" aria-labelledby="decide-heading">
          <h2 id="decide-heading" class="title">Your decision</h2>
          <mat-form-field class="comments">
            <mat-label>Comments (required to return; kept with the review)</mat-label>
            <textarea matInput rows="3" [formControl]="comments"></textarea>
          </mat-form-field>
          @if (working(); as w) {
            <mat-progress-bar mode="indeterminate" [attr.aria-label]="w" />
            <p class="ohm-muted">{{ w }}</p>
          }
          <div class="buttons">
            <button mat-flat-button type="button" [disabled]="!!working() || ownAnalysis()" (click)="confirmApproval(a)"><mat-icon>verified</mat-icon>Approve and issue the report…</button>
            <button mat-stroked-button type="button" [disabled]="!!working() || ownAnalysis() || comments.value.trim().length < 5" (click)="sendBack(a)"><mat-icon>undo</mat-icon>Return to the analyst</button>
          </div>
        </section>
      }
    } @else {
      <mat-progress-bar mode="indeterminate" aria-label="Loading the analysis" />
    }
  `,
  styles: `
    .code { font-family: ui-monospace, monospace; }
    .title { font: var(--mat-sys-title-medium); margin: 16px 0 4px; }
    .comments { width: 100%; }
    .spectra { margin: 12px 0; }
    .spectra summary { cursor: pointer; font: var(--mat-sys-title-small); padding: 6px 0; }
    .buttons { display: flex; gap: 8px; flex-wrap: wrap; }
    .issuing { margin: 12px 0; }
  `,
})
export class ReviewPage {
  private readonly data = inject(AnalysesData);
  private readonly files = inject(ReportFiles);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  readonly id = input.required<string>();

  protected readonly analysis = signal<Analysis | null>(null);
  protected readonly working = signal<string | null>(null);
  protected readonly refusal = signal<string | null>(null);
  /** The report's issuance once approved: issuing (followed by `followIssuance`), issued or failed. */
  protected readonly issuance = signal<ApprovalResult | null>(null);
  private polling: Subscription | null = null;
  private readonly destroyRef = inject(DestroyRef);
  protected readonly comments = new FormControl('', { nonNullable: true, validators: [Validators.maxLength(5000)] });
  protected readonly statusLabel = analysisStatusLabel;
  protected readonly statusText = computed(() => {
    const a = this.analysis();
    if (!a) return '';
    const state = this.issuance()?.state;
    if (a.status === 'approved' && state === 'issuing') return 'approved, issuing the report';
    if (a.status === 'approved' && state === 'failed') return 'approved, issuing the report failed';
    return this.statusLabel(a.status);
  });
  protected readonly ownAnalysis = computed(() => this.analysis()?.analyst.id === this.session.user()?.id);

  private readonly measurements = inject(MeasurementsData);
  /** The replicates the analysis scored, in view without opening anything. */
  protected readonly replicates = signal<Replicate[] | null>(null);

  constructor() {
    this.destroyRef.onDestroy(() => this.polling?.unsubscribe());
    effect(() =>
      this.data.get(this.id()).subscribe((a) => {
        this.analysis.set(a);
        if (a.status === 'approved') this.follow(a.id, false);
        const used = new Set(a.result.replicateIds);
        this.measurements.forSample(a.sample.id).subscribe((m) => this.replicates.set(m.replicates.filter((r) => used.has(r.id))));
      }),
    );
  }

  /** Asks first, naming the report number to come and the credential that will sign. */
  protected confirmApproval(a: Analysis): void {
    this.dialog
      .open<ApprovalConfirmDialog, ApprovalConfirmData, boolean>(ApprovalConfirmDialog, { data: { sampleCode: a.sample.code }, autoFocus: 'dialog', maxWidth: '640px' })
      .afterClosed()
      .pipe(filter((confirmed) => confirmed === true))
      .subscribe(() => this.approve(a));
  }

  private approve(a: Analysis): void {
    this.refusal.set(null);
    this.working.set('Approving…');
    this.data.approve(a.id, this.comments.value).subscribe({
      next: (result) => {
        this.working.set(null);
        this.issuance.set(result);
        this.analysis.update((current) => (current ? { ...current, status: 'approved' } : current));
        this.follow(a.id, true);
      },
      error: (e: unknown) => {
        this.working.set(null);
        this.refusal.set(reviewRefusal(ApiProblem.from(e)));
      },
    });
  }

  protected sendBack(a: Analysis): void {
    this.refusal.set(null);
    this.working.set('Returning the analysis…');
    this.data.returnToAnalyst(a.id, this.comments.value).subscribe({
      next: (updated) => {
        this.working.set(null);
        this.analysis.set(updated);
        this.notifier.success(`Returned to ${updated.analyst.displayName} with your comments.`);
      },
      error: (e: unknown) => {
        this.working.set(null);
        this.refusal.set(reviewRefusal(ApiProblem.from(e)));
      },
    });
  }

  /** Follows the issuance (quickly at first, see `followIssuance`) until the report is issued or every attempt failed. */
  private follow(analysisId: string, announce: boolean): void {
    this.polling?.unsubscribe();
    this.polling = followIssuance(() => this.data.issuance(analysisId))
      .subscribe({
        next: (i) => {
          this.issuance.set(i);
          if (i.state === 'issued') {
            this.data.get(analysisId).subscribe((updated) => this.analysis.set(updated));
            if (announce && i.report) this.notifier.success(`Report ${i.report.number} issued.`);
          }
        },
        error: (e: unknown) => this.refusal.set(reviewRefusal(ApiProblem.from(e))),
      });
  }

  protected retry(a: Analysis): void {
    this.data.retryIssuance(a.id).subscribe({
      next: (i) => {
        this.issuance.set(i);
        this.follow(a.id, true);
      },
      error: (e: unknown) => this.refusal.set(reviewRefusal(ApiProblem.from(e))),
    });
  }

  protected download(done: ApprovalResult): void {
    if (done.report) this.files.download(done.report.id, `${done.report.number}.pdf`);
  }
}
