import type { Routes } from '@angular/router';
import { AdjustmentsPage } from './adjustments-page';
import { LabPaymentsPage } from './lab-payments-page';
import { PricesPacksPage } from './prices-packs-page';

export default [
  { path: '', title: 'Prices & packs · Ohmprint lab', component: PricesPacksPage },
  { path: 'payments', title: 'Payments · Ohmprint lab', component: LabPaymentsPage },
  { path: 'adjustments', title: 'Credit adjustments · Ohmprint lab', component: AdjustmentsPage },
] satisfies Routes;
