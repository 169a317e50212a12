import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { EmptyState } from './empty-state';

@Component({
  selector: 'ohm-not-found-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [EmptyState, MatButtonModule, RouterLink],
  template: `
    <ohm-empty-state icon="explore_off" heading="There is no page at this address" [pageHeading]="true">
      <p>The link may be old, or the page may have moved. Use the navigation, or start again from home.</p>
      <a mat-flat-button routerLink="/">Go to home</a>
    </ohm-empty-state>
  `,
})
export class NotFoundPage {}
