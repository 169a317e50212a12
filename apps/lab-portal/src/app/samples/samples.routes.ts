import type { Routes } from '@angular/router';
import { SamplePage } from './sample-page';

export default [{ path: ':id', title: 'Sample · Ohmprint lab', component: SamplePage }] satisfies Routes;
