import type { Routes } from '@angular/router';
import { BenchPage } from './bench-page';
import { CellPage } from './cell-page';

export default [
  { path: '', title: 'Instruments and cells · Ohmprint lab', component: BenchPage },
  { path: 'cells/:id', title: 'Cell control chart · Ohmprint lab', component: CellPage },
] satisfies Routes;
