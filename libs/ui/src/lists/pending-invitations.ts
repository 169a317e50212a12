import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Invitation } from '@ohmprint/contracts';
import { roleList } from '../auth/role-labels';

/** Invited people who have not joined yet: they are not in the member list until they accept. */
@Component({
  selector: 'ohm-pending-invitations',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatIconModule],
  template: `
    @if (invitations().length > 0) {
      <section aria-labelledby="ohm-pending-heading">
        <h2 id="ohm-pending-heading">Waiting to join ({{ total() }})</h2>
        <p class="lead">They appear in the list above once they accept the e-mailed link.</p>
        <ul>
          @for (invitation of invitations(); track invitation.id) {
            <li>
              <mat-icon aria-hidden="true">{{ isExpired(invitation) ? 'timer_off' : 'schedule_send' }}</mat-icon>
              <span class="email">{{ invitation.email }}</span>
              <span class="roles">{{ roles(invitation) }}</span>
              <span class="when">
                @if (isExpired(invitation)) {
                  Expired {{ invitation.expiresAt | date: 'd MMM y' }}: invite again
                } @else {
                  Invited {{ invitation.createdAt | date: 'd MMM y' }}, link valid until {{ invitation.expiresAt | date: 'd MMM y' }}
                }
              </span>
            </li>
          }
        </ul>
      </section>
    }
  `,
  styles: `
    section {
      margin-top: 24px;
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .lead {
      margin: 4px 0 8px;
      color: var(--mat-sys-on-surface-variant);
    }
    ul {
      list-style: none;
      margin: 0;
      padding: 0;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
    }
    li {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 4px 16px;
      padding: 8px 16px;
    }
    li + li {
      border-top: 1px solid var(--mat-sys-outline-variant);
    }
    mat-icon {
      color: var(--mat-sys-on-surface-variant);
    }
    .email {
      font: var(--mat-sys-body-large);
      min-width: 16rem;
    }
    .roles,
    .when {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class PendingInvitations {
  readonly invitations = input.required<readonly Invitation[]>();
  readonly total = input(0);

  protected roles(invitation: Invitation): string {
    return roleList(invitation.roles);
  }

  protected isExpired(invitation: Invitation): boolean {
    return invitation.status === 'expired' || Date.parse(invitation.expiresAt) < Date.now();
  }
}
