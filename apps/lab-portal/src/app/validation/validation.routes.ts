import type { Routes } from '@angular/router';
import { ValidationPage } from './validation-page';

export default [{ path: '', title: 'Method validation · Ohmprint lab', component: ValidationPage }] satisfies Routes;
