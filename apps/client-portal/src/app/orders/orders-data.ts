import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { OrderPageSchema, type ListQuery, type OrderPage, type OrderStatus } from '@ohmprint/contracts';
import { queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** The organisation's orders with their samples, as the client sees them. */
@Injectable({ providedIn: 'root' })
export class OrdersData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery, status: OrderStatus | null): Observable<OrderPage> {
    let params = queryParams(query);
    if (status) params = params.set('status', status);
    return this.http.get('/api/client/orders', { params }).pipe(map((r) => OrderPageSchema.parse(r)));
  }

  /** Orders still being worked on, newest first, for the home page. */
  open(limit: number): Observable<OrderPage> {
    const params = new HttpParams().set('sort', 'placedAt').set('dir', 'desc').set('page', 1).set('pageSize', limit).set('status', 'in-progress');
    return this.http.get('/api/client/orders', { params }).pipe(map((r) => OrderPageSchema.parse(r)));
  }
}
