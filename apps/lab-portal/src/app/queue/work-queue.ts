import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { MATRIX_LABELS, SAMPLE_STATES, type Matrix, type SampleState, type WorkQueueItem } from '@ohmprint/contracts';
import { EmptyState, SAMPLE_STATE_LOOK, SampleStateChip, SearchField, ServerList, Session, someOf } from '@ohmprint/ui';
import { QueueData } from './queue-data';
import { statesForRoles } from './role-states';

/** What needs me now: samples in the states my roles act on, oldest first, against turnaround. */
@Component({
  selector: 'ohm-work-queue',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe, DecimalPipe, FormsModule, RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule,
    MatChipsModule, MatIconModule, MatButtonModule, SearchField, EmptyState, SampleStateChip,
  ],
  host: { '[class.embedded]': 'embedded()' },
  templateUrl: './work-queue.html',
  styleUrl: './work-queue.scss',
})
export class WorkQueue {
  private readonly data = inject(QueueData);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  /** On the home page, under its own heading: no page header of its own. */
  readonly embedded = input(false);

  protected readonly allStates = SAMPLE_STATES;
  protected readonly stateLook = SAMPLE_STATE_LOOK;
  protected readonly columns = ['code', 'state', 'product', 'client', 'age', 'due'];
  /** Without `states` in the URL, the states the user's roles act on; `states=` (empty) is every state. */
  protected readonly list = new ServerList<WorkQueueItem, { states: readonly SampleState[] }>({
    sorts: ['age', 'due', 'code', 'state', 'product', 'client'],
    sort: 'age',
    dir: 'desc',
    filters: { states: someOf(SAMPLE_STATES, statesForRoles(this.session.roles())) },
    fetch: (query, f) => this.data.list(query, f.states),
  });
  protected readonly isIntake = this.session.hasAnyRole(['intake-technician']);

  protected filterStates(states: readonly SampleState[]): void {
    this.list.filter({ states });
  }

  protected showAll(): void {
    this.filterStates([]);
  }

  protected matrixWords(matrix: Matrix): string {
    return MATRIX_LABELS[matrix];
  }

  /** Share of the turnaround target used so far, capped for the bar. */
  protected agePercent(item: WorkQueueItem): number {
    return Math.min(100, (item.ageDays / Math.max(1, item.turnaroundDays)) * 100);
  }

  /** Where a sample is worked on: the intake bench until it is accepted, its own page after. */
  protected linkOf(item: WorkQueueItem): { path: string[]; query: Record<string, string> | null } {
    if (item.state === 'awaiting-arrival' || item.state === 'received') return { path: ['/intake'], query: { code: item.code } };
    return { path: ['/samples', item.id], query: null };
  }

  protected open(item: WorkQueueItem): void {
    const { path, query } = this.linkOf(item);
    void this.router.navigate(path, query ? { queryParams: query } : {});
  }
}
