import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  CheckoutStartedSchema,
  CheckoutStatusSchema,
  CreditBalanceSchema,
  CreditPackOfferSchema,
  LedgerPageSchema,
  PaymentPageSchema,
  type CheckoutStarted,
  type CheckoutStatus,
  type CreditBalanceView,
  type CreditPackOffer,
  type LedgerEntry,
  type ListQuery,
  type Page,
  type Payment,
  type PaymentState,
} from '@ohmprint/contracts';
import { queryParams, quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

/** The organisation's credits, the packs on sale, checkouts, the ledger and payments. */
@Injectable({ providedIn: 'root' })
export class CreditsData {
  private readonly http = inject(HttpClient);

  balance(quiet = false): Observable<CreditBalanceView> {
    return this.http.get('/api/client/credits', quiet ? { context: quietRequest() } : {}).pipe(map((r) => CreditBalanceSchema.parse(r)));
  }

  packs(): Observable<CreditPackOffer[]> {
    return this.http.get('/api/client/credit-packs').pipe(map((r) => z.array(CreditPackOfferSchema).parse(r)));
  }

  /** Starts a checkout; the caller sends the browser to `checkoutUrl`. */
  buy(packId: string): Observable<CheckoutStarted> {
    return this.http.post('/api/client/credit-checkouts', { packId }).pipe(map((r) => CheckoutStartedSchema.parse(r)));
  }

  checkout(sessionId: string): Observable<CheckoutStatus> {
    return this.http.get(`/api/client/credit-checkouts/${encodeURIComponent(sessionId)}`, { context: quietRequest() }).pipe(map((r) => CheckoutStatusSchema.parse(r)));
  }

  abandon(sessionId: string): Observable<CheckoutStatus> {
    return this.http.post(`/api/client/credit-checkouts/${encodeURIComponent(sessionId)}/abandon`, {}, { context: quietRequest() }).pipe(map((r) => CheckoutStatusSchema.parse(r)));
  }

  ledger(query: ListQuery): Observable<Page<LedgerEntry>> {
    return this.http.get('/api/client/ledger', { params: queryParams(query) }).pipe(map((r) => LedgerPageSchema.parse(r)));
  }

  payments(query: ListQuery, status: PaymentState | null): Observable<Page<Payment>> {
    const params = { ...queryParams(query), ...(status ? { status } : {}) };
    return this.http.get('/api/client/payments', { params }).pipe(map((r) => PaymentPageSchema.parse(r)));
  }
}

/** Whole-page redirect to the payment service's checkout page (kept apart so tests can replace it). */
@Injectable({ providedIn: 'root' })
export class BrowserLocation {
  assign(url: string): void {
    window.location.assign(url);
  }
}
