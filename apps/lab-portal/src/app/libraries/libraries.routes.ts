import type { Routes } from '@angular/router';
import { roleGuard } from '@ohmprint/ui';
import { LibrariesPage } from './libraries-page';
import { LibraryVersionPage } from './library-version-page';
import { MethodsPage } from './methods-page';

export default [
  { path: '', title: 'Reference libraries · Ohmprint lab', component: LibrariesPage },
  { path: 'versions/:id', title: 'Library version · Ohmprint lab', component: LibraryVersionPage },
  { path: 'methods', title: 'Methods · Ohmprint lab', canActivate: [roleGuard('lab-admin', 'analyst', 'reviewer')], component: MethodsPage },
] satisfies Routes;
