import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { SampleState } from '@ohmprint/contracts';

/** Plain words and an icon for each state of a sample, the same in both portals. */
export const SAMPLE_STATE_LOOK: Readonly<Record<SampleState, { readonly icon: string; readonly label: string }>> = {
  'awaiting-arrival': { icon: 'local_shipping', label: 'Awaiting arrival' },
  received: { icon: 'inventory_2', label: 'Received' },
  accepted: { icon: 'task_alt', label: 'Accepted' },
  rejected: { icon: 'block', label: 'Rejected at intake' },
  measuring: { icon: 'electric_meter', label: 'Being measured' },
  analysed: { icon: 'query_stats', label: 'Analysed' },
  'in-review': { icon: 'rate_review', label: 'In review' },
  'returned-for-rework': { icon: 'undo', label: 'Returned for rework' },
  reported: { icon: 'description', label: 'Reported' },
};

@Component({
  selector: 'ohm-sample-state-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  host: { '[class]': "'state ' + state()" },
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().label }}</span>`,
  styles: `
    :host { display: inline-flex; align-items: center; gap: 4px; padding: 1px 8px 1px 4px; border-radius: 999px;
      font: var(--mat-sys-label-medium); white-space: nowrap; background: var(--mat-sys-surface-container-high);
      color: var(--mat-sys-on-surface); }
    mat-icon { width: 18px; height: 18px; font-size: 18px; }
    :host(.rejected), :host(.returned-for-rework) { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
    :host(.reported) { background: var(--mat-sys-primary-container); color: var(--mat-sys-on-primary-container); }
  `,
})
export class SampleStateChip {
  readonly state = input.required<SampleState>();
  protected readonly look = computed(() => SAMPLE_STATE_LOOK[this.state()]);
}
