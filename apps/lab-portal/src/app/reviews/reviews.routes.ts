import type { Routes } from '@angular/router';
import { ReviewPage } from './review-page';
import { ReviewQueue } from './review-queue';

export default [
  { path: '', title: 'Reviews · Ohmprint lab', component: ReviewQueue },
  { path: ':id', title: 'Review · Ohmprint lab', component: ReviewPage },
] satisfies Routes;
