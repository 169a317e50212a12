import type { Routes } from '@angular/router';
import { ClientReportsPage } from './client-reports-page';

export default [{ path: '', title: 'Reports · Ohmprint', component: ClientReportsPage }] satisfies Routes;
