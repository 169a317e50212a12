import type { Routes } from '@angular/router';
import { StaffPage } from './staff-page';

export default [{ path: '', title: 'Staff · Ohmprint lab', component: StaffPage }] satisfies Routes;
