import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { ReportStatus } from '@ohmprint/contracts';

const LOOK: Record<ReportStatus, { icon: string; label: string }> = {
  issued: { icon: 'verified', label: 'Issued' },
  superseded: { icon: 'history', label: 'Superseded' },
  revoked: { icon: 'block', label: 'Revoked' },
};

@Component({
  selector: 'ohm-report-status-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  host: { '[class]': 'status()' },
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon>{{ look().label }}`,
  styles: `
    :host { display: inline-flex; align-items: center; gap: 4px; padding: 1px 8px 1px 4px; border-radius: 999px; font: var(--mat-sys-label-medium);
      background: var(--mat-sys-surface-container-high); }
    mat-icon { width: 18px; height: 18px; font-size: 18px; }
    :host(.issued) { background: var(--mat-sys-primary-container); color: var(--mat-sys-on-primary-container); }
    :host(.revoked) { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
  `,
})
export class ReportStatusChip {
  readonly status = input.required<ReportStatus>();
  protected readonly look = computed(() => LOOK[this.status()]);
}
