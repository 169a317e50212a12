import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { EmptyState } from '../feedback/empty-state';
import type { ListView } from './server-list';

/**
 * What a server-side list says when it has no rows: it could not be loaded (with a retry), the
 * search matched nothing, or there is nothing yet (the projected content, which differs per list).
 */
@Component({
  selector: 'ohm-list-status',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, EmptyState],
  template: `
    @if (!list().loading() && list().rows().length === 0) {
      @if (list().failed()) {
        <ohm-empty-state icon="cloud_off" [heading]="failedHeading()">
          <p>Check your connection, then try again.</p>
          <button mat-stroked-button type="button" (click)="list().reload()">Try again</button>
        </ohm-empty-state>
      } @else if (list().searchText()) {
        <ohm-empty-state icon="search_off" heading="{{ noMatch() }} “{{ list().searchText() }}”">
          <p>{{ searchHint() }}</p>
        </ohm-empty-state>
      } @else {
        <ng-content />
      }
    }
  `,
})
export class ListStatus {
  readonly list = input.required<ListView>();
  readonly failedHeading = input.required<string>();
  /** The start of the no-match heading, before the quoted search text: "No one matches". */
  readonly noMatch = input.required<string>();
  readonly searchHint = input.required<string>();
}
