import type { Routes } from '@angular/router';
import { AppShell, NotFoundPage, ProfilePage, authRoutes, roleGuard, signedInGuard } from '@ohmprint/ui';

/** Each feature is one line in `children`: its folder's `<feature>.routes.ts` default export. */
export const routes: Routes = [
  ...authRoutes,
  {
    path: '',
    component: AppShell,
    canActivate: [signedInGuard],
    children: [
      { path: '', title: 'Home · Ohmprint lab', loadComponent: () => import('./home/lab-home').then((m) => m.LabHome) },
      { path: 'profile', title: 'Profile · Ohmprint lab', component: ProfilePage },
      { path: 'staff', canActivate: [roleGuard('lab-admin')], loadChildren: () => import('./staff/staff.routes') },
      { path: 'clients', canActivate: [roleGuard('lab-admin')], loadChildren: () => import('./client-organisations/client-organisations.routes') },
      { path: 'labs', canActivate: [roleGuard('platform-operator')], loadChildren: () => import('./labs/labs.routes') },
      { path: 'queue', loadChildren: () => import('./queue/queue.routes') },
      { path: 'intake', canActivate: [roleGuard('intake-technician')], loadChildren: () => import('./intake/intake.routes') },
      { path: 'samples', loadChildren: () => import('./samples/samples.routes') },
      { path: 'reviews', canActivate: [roleGuard('reviewer')], loadChildren: () => import('./reviews/reviews.routes') },
      { path: 'reports', canActivate: [roleGuard('reviewer', 'lab-admin', 'analyst')], loadChildren: () => import('./reports/reports.routes') },
      { path: 'libraries', canActivate: [roleGuard('analyst', 'reviewer', 'lab-admin')], loadChildren: () => import('./libraries/libraries.routes') },
      { path: 'instrument-keys', canActivate: [roleGuard('lab-admin')], loadChildren: () => import('./instrument-keys/instrument-keys.routes') },
      { path: '**', title: 'Not found · Ohmprint lab', component: NotFoundPage },
    ],
  },
];
