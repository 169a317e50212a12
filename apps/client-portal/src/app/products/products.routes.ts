import type { Routes } from '@angular/router';
import { roleGuard } from '@ohmprint/ui';
import { ProductsPage } from './products-page';

export default [
  { path: '', title: 'Products · Ohmprint', component: ProductsPage },
  { path: ':id/enrol', title: 'Enrol reference lots · Ohmprint', canActivate: [roleGuard('client-admin')],
    loadComponent: () => import('../enrolment/enrolment-page').then((m) => m.EnrolmentPage) },
] satisfies Routes;
