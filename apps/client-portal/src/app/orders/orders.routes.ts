import type { Routes } from '@angular/router';
import { roleGuard } from '@ohmprint/ui';
import { OrdersPage } from './orders-page';

export default [
  { path: '', title: 'Orders · Ohmprint', component: OrdersPage },
  { path: 'new', title: 'Order a check · Ohmprint', canActivate: [roleGuard('client-admin')],
    loadComponent: () => import('./new-check/new-check-page').then((m) => m.NewCheckPage) },
  { path: ':id', title: 'Order · Ohmprint', loadComponent: () => import('./order-detail-page').then((m) => m.OrderDetailPage) },
] satisfies Routes;
