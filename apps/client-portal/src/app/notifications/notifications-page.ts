import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';
import { NOTIFICATION_EVENT_LABELS, type ClientNotification, type NotificationEvent } from '@ohmprint/contracts';
import { EmptyState, ListStatus, Notifier, ServerList, onOff } from '@ohmprint/ui';
import { NotificationsData } from './notifications-data';

const EVENT_ICONS: Record<NotificationEvent, string> = {
  invitation: 'mail',
  'order-placed': 'shopping_cart',
  'payment-received': 'receipt_long',
  'sample-received': 'inventory_2',
  'sample-rejected': 'report',
  'report-issued': 'description',
  'report-amended': 'edit_document',
  'report-revoked': 'block',
};

/** What the lab told the organisation: newest first, unread marked, each linking to its order or report. */
@Component({
  selector: 'ohm-notifications-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, MatPaginatorModule, MatProgressBarModule, MatSlideToggleModule, EmptyState, ListStatus],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Notifications</h1>
        <p>What the lab told you about your orders, samples and reports. The same messages went to you by e-mail.</p>
      </div>
      <button mat-stroked-button type="button" (click)="markAll()" [disabled]="!unreadCount()"><mat-icon>done_all</mat-icon>Mark all read</button>
    </header>
    <mat-slide-toggle [checked]="unreadOnly()" (change)="list.filter({ unread: $event.checked })">Unread only</mat-slide-toggle>
    @if (list.loading()) {
      <mat-progress-bar mode="indeterminate" aria-label="Loading notifications" />
    }
    @if (list.rows().length) {
      <ul class="list" aria-label="Notifications">
        @for (n of list.rows(); track n.id) {
          <li class="item" [class.unread]="!n.readAt">
            <mat-icon class="kind" aria-hidden="true">{{ icon(n) }}</mat-icon>
            <div class="text">
              <p class="meta">
                <span>{{ label(n) }}</span> · <time [attr.datetime]="n.createdAt">{{ n.createdAt | date: 'd MMM y, HH:mm' }}</time>
                @if (!n.readAt) { · <strong class="new">Unread</strong> }
              </p>
              <h2 class="subject">{{ n.subject }}</h2>
              <p class="body">{{ n.body }}</p>
            </div>
            <div class="actions">
              @if (n.link) {
                <a mat-button [routerLink]="n.link" (click)="open(n)"><mat-icon>open_in_new</mat-icon>{{ n.link.startsWith('/reports') ? 'Open reports' : 'Open order' }}</a>
              }
              @if (!n.readAt) {
                <button mat-button type="button" (click)="markRead(n)">Mark read</button>
              }
            </div>
          </li>
        }
      </ul>
      <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [hidePageSize]="true" (page)="list.turn($event)" aria-label="Notification pages" />
    } @else if (!list.loading()) {
      <ohm-list-status [list]="list" failedHeading="Your notifications could not be loaded" noMatch="No notification matches" searchHint="">
        <ohm-empty-state icon="notifications_none" [heading]="unreadOnly() ? 'Nothing unread' : 'No notifications yet'">
          <p>When the lab receives a sample, issues a report or changes one, it appears here.</p>
        </ohm-empty-state>
      </ohm-list-status>
    }
  `,
  styles: `
    :host { display: block; max-width: 960px; }
    mat-slide-toggle { margin: 0 0 12px; }
    .list { list-style: none; margin: 0; padding: 0; display: grid; gap: 8px; }
    .item { display: grid; grid-template-columns: auto 1fr auto; gap: 12px; align-items: start; padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium); background: var(--mat-sys-surface-container-low); border-left: 4px solid transparent; }
    .item.unread { background: var(--mat-sys-surface-container-high); border-left-color: var(--mat-sys-primary); }
    .kind { color: var(--mat-sys-primary); margin-top: 2px; }
    .meta { margin: 0; font: var(--mat-sys-label-medium); color: var(--mat-sys-on-surface-variant); }
    .new { color: var(--mat-sys-primary); }
    .subject { margin: 2px 0 4px; font: var(--mat-sys-title-small); }
    .unread .subject { font-weight: 700; }
    .body { margin: 0; white-space: pre-line; font: var(--mat-sys-body-medium); }
    .actions { display: flex; flex-direction: column; align-items: flex-end; gap: 4px; }
    @media (max-width: 600px) {
      .item { grid-template-columns: auto 1fr; }
      .actions { grid-column: 2; flex-direction: row; align-items: center; }
    }
  `,
})
export class NotificationsPage {
  private readonly data = inject(NotificationsData);
  private readonly notifier = inject(Notifier);
  protected readonly list = new ServerList<ClientNotification, { unread: boolean }>({
    sorts: ['createdAt'],
    sort: 'createdAt',
    dir: 'desc',
    pageSizes: [20],
    filters: { unread: onOff() },
    fetch: (query, f) => this.data.list(query.page, query.pageSize, f.unread),
  });
  protected readonly unreadOnly = computed(() => this.list.filters().unread);
  protected readonly unreadCount = computed(() => this.data.unread() ?? 0);

  protected icon(n: ClientNotification): string {
    return EVENT_ICONS[n.event];
  }

  protected label(n: ClientNotification): string {
    return NOTIFICATION_EVENT_LABELS[n.event];
  }

  protected open(n: ClientNotification): void {
    if (!n.readAt) this.data.markRead(n.id).subscribe();
  }

  protected markRead(n: ClientNotification): void {
    this.data.markRead(n.id).subscribe(() => this.list.reload());
  }

  protected markAll(): void {
    this.data.markAllRead().subscribe((marked) => {
      this.notifier.success(marked === 1 ? 'One notification marked read.' : `${marked} notifications marked read.`);
      this.list.reload();
    });
  }
}
