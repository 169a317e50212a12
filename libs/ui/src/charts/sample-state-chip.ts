import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { SAMPLE_STATE_LABELS, type SampleState } from '@ohmprint/contracts';

/** Plain words and an icon for each state of a sample, the same in both portals. */
export const SAMPLE_STATE_LOOK: Readonly<Record<SampleState, { readonly icon: string; readonly label: string }>> = {
  'awaiting-arrival': { icon: 'local_shipping', label: SAMPLE_STATE_LABELS['awaiting-arrival'] },
  received: { icon: 'inventory_2', label: SAMPLE_STATE_LABELS.received },
  accepted: { icon: 'task_alt', label: SAMPLE_STATE_LABELS.accepted },
  rejected: { icon: 'block', label: SAMPLE_STATE_LABELS.rejected },
  measuring: { icon: 'electric_meter', label: SAMPLE_STATE_LABELS.measuring },
  analysed: { icon: 'query_stats', label: SAMPLE_STATE_LABELS.analysed },
  'in-review': { icon: 'rate_review', label: SAMPLE_STATE_LABELS['in-review'] },
  'returned-for-rework': { icon: 'undo', label: SAMPLE_STATE_LABELS['returned-for-rework'] },
  reported: { icon: 'description', label: SAMPLE_STATE_LABELS.reported },
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
