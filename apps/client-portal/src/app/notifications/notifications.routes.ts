import type { Routes } from '@angular/router';
import { NotificationsPage } from './notifications-page';

export default [{ path: '', title: 'Notifications · Ohmprint', component: NotificationsPage }] satisfies Routes;
