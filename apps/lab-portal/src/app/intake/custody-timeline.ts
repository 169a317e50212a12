import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MANUAL_CUSTODY_KINDS, type CustodyEvent, type CustodyEventKind } from '@ohmprint/contracts';
import { ApiProblem, Notifier, showFieldErrors } from '@ohmprint/ui';
import { IntakeData } from './intake-data';

export const CUSTODY_LABELS: Readonly<Record<CustodyEventKind, string>> = {
  received: 'Received',
  accepted: 'Accepted',
  rejected: 'Rejected',
  stored: 'Stored',
  moved: 'Moved',
  'taken-for-measurement': 'Taken for measurement',
  'returned-to-storage': 'Returned to storage',
  'sent-out': 'Sent out',
  disposed: 'Disposed of',
};

/** Who had the sample, when, where and why; new movements are appended, never edited. */
@Component({
  selector: 'ohm-custody-timeline',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatIconModule],
  template: `
    @if (events().length === 0) {
      <p class="ohm-muted">No custody events yet: the first is written when the parcel is received.</p>
    } @else {
      <ol class="timeline" aria-label="Chain of custody, oldest first">
        @for (e of events(); track e.id) {
          <li>
            <span class="when">{{ e.occurredAt | date: 'd MMM y, HH:mm' }}</span>
            <span class="what">{{ labels[e.kind] }}</span>
            <span class="where"><mat-icon aria-hidden="true">place</mat-icon>{{ e.location || '—' }}</span>
            <span class="who"><mat-icon aria-hidden="true">person</mat-icon>{{ e.actor.displayName }}</span>
            @if (e.reason) {
              <span class="why">{{ e.reason }}</span>
            }
          </li>
        }
      </ol>
    }
    @if (canRecord()) {
      @if (recording()) {
        <form [formGroup]="form" (ngSubmit)="record()" class="movement">
          <mat-form-field>
            <mat-label>What happened</mat-label>
            <mat-select formControlName="kind">
              @for (k of manualKinds; track k) {
                <mat-option [value]="k">{{ labels[k] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Where it is now</mat-label>
            <input matInput formControlName="location" />
            @if (form.controls.location.hasError('server')) {
              <mat-error>{{ form.controls.location.getError('server') }}</mat-error>
            }
          </mat-form-field>
          <mat-form-field class="wide">
            <mat-label>Why</mat-label>
            <input matInput formControlName="reason" />
            @if (form.controls.reason.hasError('server')) {
              <mat-error>{{ form.controls.reason.getError('server') }}</mat-error>
            }
          </mat-form-field>
          <button mat-flat-button type="submit" [disabled]="form.invalid || saving()">Record</button>
          <button mat-button type="button" (click)="recording.set(false)">Cancel</button>
        </form>
      } @else {
        <button mat-stroked-button type="button" (click)="recording.set(true)"><mat-icon>move_down</mat-icon>Record a movement</button>
      }
    }
  `,
  styles: `
    .timeline { list-style: none; margin: 0 0 12px; padding: 0 0 0 16px; border-left: 2px solid var(--mat-sys-outline-variant); }
    li { position: relative; display: flex; flex-wrap: wrap; gap: 2px 16px; padding: 6px 0; }
    li::before { content: ''; position: absolute; left: -22px; top: 12px; width: 10px; height: 10px; border-radius: 50%;
      background: var(--mat-sys-primary); }
    .when { font-variant-numeric: tabular-nums; color: var(--mat-sys-on-surface-variant); min-width: 140px; }
    .what { font-weight: 600; min-width: 150px; }
    .where, .who { display: inline-flex; align-items: center; gap: 4px; }
    .where mat-icon, .who mat-icon { width: 16px; height: 16px; font-size: 16px; color: var(--mat-sys-on-surface-variant); }
    .why { flex-basis: 100%; color: var(--mat-sys-on-surface-variant); }
    .movement { display: flex; flex-wrap: wrap; gap: 0 12px; align-items: baseline; }
    .wide { flex: 1 1 260px; }
  `,
})
export class CustodyTimeline {
  private readonly data = inject(IntakeData);
  private readonly notifier = inject(Notifier);
  readonly sampleId = input.required<string>();
  readonly events = input.required<readonly CustodyEvent[]>();
  readonly canRecord = input(true);
  readonly recorded = output<CustodyEvent>();

  protected readonly labels = CUSTODY_LABELS;
  protected readonly manualKinds = MANUAL_CUSTODY_KINDS;
  protected readonly recording = signal(false);
  protected readonly saving = signal(false);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    kind: ['moved' as (typeof MANUAL_CUSTODY_KINDS)[number], Validators.required],
    location: ['', [Validators.required, Validators.maxLength(200)]],
    reason: ['', [Validators.required, Validators.maxLength(1000)]],
  });

  protected record(): void {
    this.saving.set(true);
    this.data.recordCustody(this.sampleId(), this.form.getRawValue()).subscribe({
      next: (event) => {
        this.saving.set(false);
        this.recording.set(false);
        this.form.reset();
        this.notifier.success(`${CUSTODY_LABELS[event.kind]} recorded.`);
        this.recorded.emit(event);
      },
      error: (e: unknown) => {
        this.saving.set(false);
        const problem = ApiProblem.from(e);
        showFieldErrors(this.form, problem);
        this.notifier.problem(problem);
      },
    });
  }
}
