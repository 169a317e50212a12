import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatBadgeModule } from '@angular/material/badge';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { NavigationEnd, Router, RouterLink } from '@angular/router';
import { catchError, filter, merge, of, switchMap, timer } from 'rxjs';
import { NotificationsData } from './notifications-data';

/** How often the bell asks for the unread count while the portal is open. */
const POLL_MS = 60_000;

/** The toolbar bell: unread count as a badge (and in words for screen readers), opening the list. */
@Component({
  selector: 'ohm-notification-bell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatBadgeModule, MatButtonModule, MatIconModule, MatTooltipModule],
  template: `
    <a
      mat-icon-button
      routerLink="/notifications"
      [attr.aria-label]="label()"
      [matTooltip]="label()"
      class="bell"
    >
      <mat-icon [matBadge]="badge()" [matBadgeHidden]="!badge()" matBadgeSize="medium">{{ unread() ? 'notifications_active' : 'notifications' }}</mat-icon>
    </a>
  `,
  styles: `
    .bell { margin-right: 4px; }
  `,
})
export class NotificationBell {
  private readonly data = inject(NotificationsData);
  protected readonly unread = computed(() => this.data.unread() ?? 0);
  protected readonly badge = computed(() => (this.unread() > 99 ? '99+' : this.unread() ? String(this.unread()) : ''));
  protected readonly label = computed(() => (this.unread() ? `Notifications, ${this.unread()} unread` : 'Notifications, none unread'));

  constructor() {
    const router = inject(Router);
    merge(timer(0, POLL_MS), router.events.pipe(filter((e) => e instanceof NavigationEnd)))
      .pipe(
        switchMap(() => this.data.refreshUnread().pipe(catchError(() => of(null)))),
        takeUntilDestroyed(inject(DestroyRef)),
      )
      .subscribe();
  }
}
