import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  CreditAccountPageSchema,
  CreditAdjustedSchema,
  CreditPackSchema,
  CreditPricesSchema,
  PaymentPageSchema,
  PaymentSchema,
  type CreateCreditPack,
  type CreditAccountView,
  type CreditAdjustment,
  type CreditPack,
  type CreditPrices,
  type ListQuery,
  type Page,
  type Payment,
  type PaymentState,
  type UpdateCreditPack,
} from '@ohmprint/contracts';
import { queryParams, quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

/** The lab's billing: prices in credits, packs, payments of every client, refunds and adjustments. */
@Injectable({ providedIn: 'root' })
export class BillingData {
  private readonly http = inject(HttpClient);

  prices(): Observable<CreditPrices> {
    return this.http.get('/api/lab/credit-prices').pipe(map((r) => CreditPricesSchema.parse(r)));
  }

  savePrices(body: CreditPrices): Observable<CreditPrices> {
    return this.http.put('/api/lab/credit-prices', body, { context: quietRequest() }).pipe(map((r) => CreditPricesSchema.parse(r)));
  }

  packs(): Observable<CreditPack[]> {
    return this.http.get('/api/lab/credit-packs').pipe(map((r) => z.array(CreditPackSchema).parse(r)));
  }

  createPack(body: CreateCreditPack): Observable<CreditPack> {
    return this.http.post('/api/lab/credit-packs', body, { context: quietRequest() }).pipe(map((r) => CreditPackSchema.parse(r)));
  }

  updatePack(id: string, body: UpdateCreditPack, quiet = true): Observable<CreditPack> {
    return this.http.patch(`/api/lab/credit-packs/${id}`, body, quiet ? { context: quietRequest() } : {}).pipe(map((r) => CreditPackSchema.parse(r)));
  }

  payments(query: ListQuery, status: PaymentState | null): Observable<Page<Payment>> {
    return this.http.get('/api/lab/payments', { params: { ...queryParams(query), ...(status ? { status } : {}) } }).pipe(map((r) => PaymentPageSchema.parse(r)));
  }

  refund(id: string): Observable<Payment> {
    return this.http.post(`/api/lab/payments/${id}/refund`, {}).pipe(map((r) => PaymentSchema.parse(r)));
  }

  accounts(query: ListQuery): Observable<Page<CreditAccountView>> {
    return this.http.get('/api/lab/credit-accounts', { params: queryParams(query) }).pipe(map((r) => CreditAccountPageSchema.parse(r)));
  }

  adjust(body: CreditAdjustment): Observable<z.infer<typeof CreditAdjustedSchema>> {
    return this.http.post('/api/lab/credit-adjustments', body, { context: quietRequest() }).pipe(map((r) => CreditAdjustedSchema.parse(r)));
  }
}
