import type { Routes } from '@angular/router';
import { OrdersPage } from './orders-page';

export default [{ path: '', title: 'Orders · Ohmprint', component: OrdersPage }] satisfies Routes;
