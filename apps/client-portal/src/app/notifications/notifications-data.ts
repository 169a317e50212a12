import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { ClientNotificationPageSchema, ClientNotificationSchema, UnreadCountSchema, type ClientNotification, type ClientNotificationPage } from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { map, tap, type Observable } from 'rxjs';

/** The signed-in client user's notifications; `unread` is shared by the toolbar bell and the page. */
@Injectable({ providedIn: 'root' })
export class NotificationsData {
  private readonly http = inject(HttpClient);
  /** Unread count as last heard from the API; null before the first answer. */
  readonly unread = signal<number | null>(null);

  refreshUnread(): Observable<number> {
    // quiet: a missed poll is not worth a message; the next one tries again
    return this.http.get('/api/client/notifications/unread-count', { context: quietRequest() }).pipe(
      map((r) => UnreadCountSchema.parse(r).unread),
      tap((n) => this.unread.set(n)),
    );
  }

  list(page: number, pageSize: number, unreadOnly: boolean): Observable<ClientNotificationPage> {
    let params = new HttpParams().set('page', page).set('pageSize', pageSize);
    if (unreadOnly) params = params.set('unread', 'true');
    return this.http.get('/api/client/notifications', { params }).pipe(map((r) => ClientNotificationPageSchema.parse(r)));
  }

  markRead(id: string): Observable<ClientNotification> {
    return this.http.post(`/api/client/notifications/${id}/read`, {}).pipe(
      map((r) => ClientNotificationSchema.parse(r)),
      tap(() => this.refreshUnread().subscribe()),
    );
  }

  markAllRead(): Observable<number> {
    return this.http.post('/api/client/notifications/read-all', {}).pipe(
      map((r) => (r as { marked: number }).marked),
      tap(() => this.unread.set(0)),
    );
  }
}
