import type { Routes } from '@angular/router';
import { VerifyPage } from './verify-page';

export default [{ path: '', title: 'Verify a report · Ohmprint', component: VerifyPage }] satisfies Routes;
