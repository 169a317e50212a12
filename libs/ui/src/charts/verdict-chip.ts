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
    :host(.consistent) { background: var(--mat-sys-primary-container); color: var(--mat-sys-on-primary-container); }
    :host(.inconclusive) { background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    :host(.not-consistent) { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
    :host(.no-verdict) { background: var(--mat-sys-surface-container-highest); color: var(--mat-sys-on-surface-variant); }
  `,
})
export class VerdictChip {
  readonly verdict = input.required<Verdict>();
  /** Table rows use the short word. */
  readonly compact = input(false);
  protected readonly look = computed(() => VERDICT_LOOK[this.verdict()]);
  protected readonly short = computed(() => VERDICT_SHORT[this.verdict()]);
}
