import type { Routes } from '@angular/router';
import { roleGuard } from '@ohmprint/ui';
import { CheckoutReturnPage } from './checkout-return-page';
import { CreditsPage } from './credits-page';
import { LedgerPage } from './ledger-page';
import { PaymentsPage } from './payments-page';

export default [
  { path: '', title: 'Credits · Ohmprint', component: CreditsPage },
  { path: 'ledger', title: 'Credit ledger · Ohmprint', component: LedgerPage },
  { path: 'payments', title: 'Payments · Ohmprint', component: PaymentsPage },
  { path: 'bought', title: 'Payment received · Ohmprint', component: CheckoutReturnPage, data: { outcome: 'bought' } },
  { path: 'not-bought', title: 'No payment made · Ohmprint', canActivate: [roleGuard('client-admin')], component: CheckoutReturnPage, data: { outcome: 'not-bought' } },
] satisfies Routes;
