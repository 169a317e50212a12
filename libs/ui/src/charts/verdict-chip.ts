import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Verdict } from '@ohmprint/contracts';

/** Icon and words for each verdict; the colour only repeats what they already say. */
export const VERDICT_LOOK: Readonly<Record<Verdict, { readonly icon: string; readonly label: string }>> = {
  consistent: { icon: 'check_circle', label: 'Consistent with the reference library' },
  inconclusive: { icon: 'help', label: 'Inconclusive' },
  'not-consistent': { icon: 'warning', label: 'Not consistent with the reference library' },
  'no-verdict': { icon: 'remove_circle_outline', label: 'No verdict' },
};

/** Short words for tables, where the full sentence would not fit. */
export const VERDICT_SHORT: Readonly<Record<Verdict, string>> = {
  consistent: 'Consistent',
  inconclusive: 'Inconclusive',
  'not-consistent': 'Not consistent',
  'no-verdict': 'No verdict',
};

@Component({
  selector: 'ohm-verdict-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  host: { '[class]': "'verdict ' + verdict()", role: 'status' },
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ compact() ? short() : look().label }}</span>`,
  styles: `
    :host { display: inline-flex; align-items: center; gap: 6px; padding: 2px 10px 2px 6px; border-radius: 999px;
      font: var(--mat-sys-label-large); white-space: nowrap; }
    mat-icon { width: 20px; height: 20px; font-size: 20px; }
    :host(.consistent) { background: var(--ohm-verdict-consistent-container); color: var(--ohm-verdict-consistent-on-container); }
    :host(.inconclusive) { background: var(--ohm-verdict-inconclusive-container); color: var(--ohm-verdict-inconclusive-on-container); }
    :host(.not-consistent) { background: var(--ohm-verdict-not-consistent-container); color: var(--ohm-verdict-not-consistent-on-container); }
    :host(.no-verdict) { background: var(--ohm-verdict-no-verdict-container); color: var(--ohm-verdict-no-verdict-on-container); }
  `,
})
export class VerdictChip {
  readonly verdict = input.required<Verdict>();
  /** Table rows use the short word. */
  readonly compact = input(false);
  protected readonly look = computed(() => VERDICT_LOOK[this.verdict()]);
  protected readonly short = computed(() => VERDICT_SHORT[this.verdict()]);
}
