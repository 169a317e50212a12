import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  OrderPageSchema,
  OrderPricesSchema,
  OrderSummarySchema,
  type ListQuery,
  type NewCheckOrder,
  type NewReferenceOrder,
  type OrderKind,
  type OrderPage,
  type OrderPrices,
  type OrderShipment,
  type OrderStatus,
  type OrderSummary,
} from '@ohmprint/contracts';
import { queryParams, quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** The organisation's orders with their samples, as the client sees them, and what a client admin does to them. */
@Injectable({ providedIn: 'root' })
export class OrdersData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery, status: OrderStatus | null, kind: OrderKind | null = null): Observable<OrderPage> {
    let params = queryParams(query);
    if (status) params = params.set('status', status);
    if (kind) params = params.set('kind', kind);
    return this.http.get('/api/client/orders', { params }).pipe(map((r) => OrderPageSchema.parse(r)));
  }

  /** Orders not finished yet (placed or in progress), newest first, for the home page. */
  open(limit: number, status: OrderStatus = 'in-progress'): Observable<OrderPage> {
    const params = new HttpParams().set('sort', 'placedAt').set('dir', 'desc').set('page', 1).set('pageSize', limit).set('status', status);
    return this.http.get('/api/client/orders', { params }).pipe(map((r) => OrderPageSchema.parse(r)));
  }

  order(id: string): Observable<OrderSummary> {
    return this.http.get(`/api/client/orders/${id}`).pipe(map((r) => OrderSummarySchema.parse(r)));
  }

  prices(): Observable<OrderPrices> {
    return this.http.get('/api/client/order-prices').pipe(map((r) => OrderPricesSchema.parse(r)));
  }

  /** QUIET: the stepper shows a refusal (such as too few credits) itself, beside what was typed. */
  placeCheck(order: NewCheckOrder): Observable<OrderSummary> {
    return this.http.post('/api/client/orders', order, { context: quietRequest() }).pipe(map((r) => OrderSummarySchema.parse(r)));
  }

  placeReferenceOrder(order: NewReferenceOrder): Observable<OrderSummary> {
    return this.http.post('/api/client/reference-orders', order, { context: quietRequest() }).pipe(map((r) => OrderSummarySchema.parse(r)));
  }

  cancel(id: string): Observable<OrderSummary> {
    return this.http.post(`/api/client/orders/${id}/cancel`, {}).pipe(map((r) => OrderSummarySchema.parse(r)));
  }

  ship(id: string, shipment: OrderShipment): Observable<OrderSummary> {
    return this.http.post(`/api/client/orders/${id}/shipment`, shipment, { context: quietRequest() }).pipe(map((r) => OrderSummarySchema.parse(r)));
  }

  addSamplePhoto(orderId: string, sampleId: string, photo: File): Observable<unknown> {
    const form = new FormData();
    form.append('photo', photo, photo.name);
    return this.http.put(`/api/client/orders/${orderId}/samples/${sampleId}/photo`, form);
  }

  /** Through HttpClient, since the sign-in token is not a cookie a plain link would carry. */
  labelPack(id: string): Observable<Blob> {
    return this.http.get(`/api/client/orders/${id}/label-pack`, { responseType: 'blob' });
  }
}
