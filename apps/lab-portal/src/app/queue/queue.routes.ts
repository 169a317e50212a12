import type { Routes } from '@angular/router';
import { WorkQueue } from './work-queue';

export default [{ path: '', title: 'Work queue · Ohmprint lab', component: WorkQueue }] satisfies Routes;
