import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { OrderSample, OrderSummary, SampleState } from '@ohmprint/contracts';

export interface TimelineStep {
  key: 'ordered' | 'shipped' | 'received' | 'rejected' | 'measuring' | 'in-review' | 'reported';
  label: string;
  done: boolean;
  current: boolean;
  at: string | null;
}

/** How far along each state is: the steps a sample in that state has completed. */
const REACHED: Record<SampleState, number> = {
  'awaiting-arrival': 0,
  received: 2,
  accepted: 2,
  rejected: 2,
  measuring: 3,
  analysed: 3,
  'returned-for-rework': 3,
  'in-review': 4,
  reported: 5,
};

/** A sample's way through the lab as steps: ordered, shipped, received, then rejected or measuring, in review, reported. */
export function timelineOf(order: Pick<OrderSummary, 'placedAt' | 'shipment'>, s: OrderSample): TimelineStep[] {
  const reached = REACHED[s.state];
  const shipped = !!order.shipment || reached >= 2;
  const steps: TimelineStep[] = [
    { key: 'ordered', label: 'Ordered', done: true, current: false, at: order.placedAt },
    { key: 'shipped', label: 'Shipped', done: shipped, current: false, at: order.shipment?.shippedAt ?? null },
    { key: 'received', label: 'Received by the lab', done: reached >= 2, current: false, at: s.receivedAt },
  ];
  if (s.state === 'rejected') {
    steps.push({ key: 'rejected', label: 'Not accepted for testing', done: true, current: true, at: s.updatedAt });
    return steps;
  }
  steps.push(
    { key: 'measuring', label: 'Measuring', done: reached >= 3, current: false, at: null },
    { key: 'in-review', label: 'In review', done: reached >= 4, current: false, at: null },
    { key: 'reported', label: 'Reported', done: reached >= 5, current: false, at: null },
  );
  const last = steps.filter((st) => st.done).pop() as TimelineStep;
  last.current = true;
  if (last.at === null) last.at = s.updatedAt;
  return steps;
}

@Component({
  selector: 'ohm-sample-timeline',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatIconModule],
  template: `
    <ol class="timeline" [attr.aria-label]="'Progress of ' + sample().code">
      @for (step of steps(); track step.key) {
        <li [class.done]="step.done" [class.current]="step.current" [class.rejected]="step.key === 'rejected'" [attr.aria-current]="step.current ? 'step' : null">
          <mat-icon aria-hidden="true">{{ step.key === 'rejected' ? 'block' : step.done ? 'check_circle' : 'radio_button_unchecked' }}</mat-icon>
          <span class="label">{{ step.label }}<span class="cdk-visually-hidden">{{ step.done ? ' (done)' : ' (not yet)' }}</span></span>
          @if (step.at && step.done) { <span class="at">{{ step.at | date: 'd MMM y' }}</span> }
        </li>
      }
    </ol>
  `,
  styles: `
    .timeline { list-style: none; margin: 0; padding: 0; display: flex; flex-wrap: wrap; gap: 4px 0; }
    li { display: grid; grid-template-columns: auto 1fr; grid-template-rows: auto auto; column-gap: 4px; align-items: center;
      padding: 4px 16px 4px 0; min-width: 104px; color: var(--mat-sys-on-surface-variant); }
    li mat-icon { grid-row: span 2; font-size: 20px; width: 20px; height: 20px; }
    li.done mat-icon { color: var(--mat-sys-primary); }
    li.rejected mat-icon { color: var(--mat-sys-error); }
    li.done { color: var(--mat-sys-on-surface); }
    li.current .label { font-weight: 600; }
    .label { font: var(--mat-sys-body-medium); }
    .at { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
  `,
})
export class SampleTimeline {
  readonly order = input.required<Pick<OrderSummary, 'placedAt' | 'shipment'>>();
  readonly sample = input.required<OrderSample>();
  protected readonly steps = computed(() => timelineOf(this.order(), this.sample()));
}
