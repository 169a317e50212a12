import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** What a list or page shows when there is nothing yet, and what to do next (projected). */
@Component({
  selector: 'ohm-empty-state',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <mat-icon class="icon" aria-hidden="true">{{ icon() }}</mat-icon>
    @if (pageHeading()) {
      <h1>{{ heading() }}</h1>
    } @else {
      <h2>{{ heading() }}</h2>
    }
    <div class="body"><ng-content /></div>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      align-items: center;
      text-align: center;
      gap: 8px;
      padding: 40px 16px;
      color: var(--mat-sys-on-surface-variant);
    }
    .icon {
      width: 48px;
      height: 48px;
      font-size: 48px;
      color: var(--mat-sys-primary);
    }
    h1,
    h2 {
      margin: 0;
      font: var(--mat-sys-title-medium);
      color: var(--mat-sys-on-surface);
    }
    .body {
      max-width: 56ch;
      font: var(--mat-sys-body-medium);
    }
  `,
})
export class EmptyState {
  readonly icon = input('inbox');
  readonly heading = input.required<string>();
  /** True when the empty state is the whole page, so its heading is the page's h1. */
  readonly pageHeading = input(false);
}
