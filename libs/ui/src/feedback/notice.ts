import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** A boxed message with icon + words (never colour alone). `tone` picks the token family. */
@Component({
  selector: 'ohm-notice',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  host: { '[attr.role]': "tone() === 'error' ? 'alert' : 'status'", '[class]': "'tone-' + tone()" },
  template: `<mat-icon aria-hidden="true">{{ icon() }}</mat-icon><div class="body"><ng-content /></div>`,
  styles: `
    :host {
      display: flex;
      gap: 12px;
      align-items: flex-start;
      padding: 12px 16px;
      margin: 0 0 16px;
      border-radius: var(--mat-sys-corner-medium);
    }
    .body {
      flex: 1;
      font: var(--mat-sys-body-medium);
    }
    :host(.tone-info) {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host(.tone-success) {
      background: var(--mat-sys-primary-container);
      color: var(--mat-sys-on-primary-container);
    }
    :host(.tone-warning) {
      background: var(--ohm-verdict-inconclusive-container);
      color: var(--ohm-verdict-inconclusive-on-container);
    }
    :host(.tone-error) {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
  `,
})
export class Notice {
  readonly tone = input<'info' | 'success' | 'warning' | 'error'>('info');
  readonly icon = input('info');
}
