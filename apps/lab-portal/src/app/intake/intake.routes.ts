import type { Routes } from '@angular/router';
import { IntakePage } from './intake-page';

export default [{ path: '', title: 'Receive samples · Ohmprint lab', component: IntakePage }] satisfies Routes;
