import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { CellControlStatus } from '@ohmprint/contracts';

const LOOK = {
  'in-control': { icon: 'check_circle', word: 'In control' },
  'out-of-control': { icon: 'block', word: 'Out of control: blocked' },
  establishing: { icon: 'hourglass_top', word: 'Setting limits' },
} as const;

/** A cell's control state as icon + word (never colour alone). */
@Component({
  selector: 'ohm-control-status',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  host: { '[class]': 'status().state', '[attr.title]': 'status().message' },
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().word }}</span>`,
  styles: `
    :host { display: inline-flex; align-items: center; gap: 4px; padding: 2px 10px 2px 6px; border-radius: 999px; font: var(--mat-sys-label-large); }
    mat-icon { width: 18px; height: 18px; font-size: 18px; }
    :host(.in-control) { background: var(--ohm-verdict-consistent-container); color: var(--ohm-verdict-consistent-on-container); }
    :host(.out-of-control) { background: var(--ohm-verdict-not-consistent-container); color: var(--ohm-verdict-not-consistent-on-container); }
    :host(.establishing) { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface); }
  `,
})
export class ControlStatusChip {
  readonly status = input.required<CellControlStatus>();
  protected readonly look = computed(() => LOOK[this.status().state]);
}
