import type { Routes } from '@angular/router';
import { ReportsPage } from './reports-page';

export default [{ path: '', title: 'Reports · Ohmprint lab', component: ReportsPage }] satisfies Routes;
