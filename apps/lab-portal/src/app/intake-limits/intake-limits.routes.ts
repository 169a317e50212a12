import type { Routes } from '@angular/router';
import { IntakeLimitsPage } from './intake-limits-page';

export default [{ path: '', title: 'Intake limits · Ohmprint lab', component: IntakeLimitsPage }] satisfies Routes;
