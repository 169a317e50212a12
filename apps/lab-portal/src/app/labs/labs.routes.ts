import type { Routes } from '@angular/router';
import { LabsPage } from './labs-page';

export default [{ path: '', title: 'Labs · Ohmprint', component: LabsPage }] satisfies Routes;
