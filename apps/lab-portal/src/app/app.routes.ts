import type { Routes } from '@angular/router';
import type { Role } from '@ohmprint/contracts';
import { AppShell, NotFoundPage, ProfilePage, authRoutes, roleGuard, signedInGuard } from '@ohmprint/ui';

/** Everyone in a lab who handles samples; the platform operator never sees a lab's samples. */
const LAB_STAFF: Role[] = ['intake-technician', 'analyst', 'reviewer', 'lab-admin'];

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
      { path: 'billing', canActivate: [roleGuard('lab-admin')], loadChildren: () => import('./billing/billing.routes') },
      { path: 'clients', canActivate: [roleGuard('lab-admin')], loadChildren: () => import('./client-organisations/client-organisations.routes') },
      { path: 'labs', canActivate: [roleGuard('platform-operator')], loadChildren: () => import('./labs/labs.routes') },
      { path: 'queue', canActivate: [roleGuard(...LAB_STAFF)], loadChildren: () => import('./queue/queue.routes') },
      { path: 'intake-limits', canActivate: [roleGuard(...LAB_STAFF)], loadChildren: () => import('./intake-limits/intake-limits.routes') },
      { path: 'intake', canActivate: [roleGuard('intake-technician')], loadChildren: () => import('./intake/intake.routes') },
      { path: 'samples', canActivate: [roleGuard(...LAB_STAFF)], loadChildren: () => import('./samples/samples.routes') },
      { path: 'reviews', canActivate: [roleGuard('reviewer')], loadChildren: () => import('./reviews/reviews.routes') },
      { path: 'reports', canActivate: [roleGuard('reviewer', 'lab-admin', 'analyst')], loadChildren: () => import('./reports/reports.routes') },
      { path: 'libraries', canActivate: [roleGuard('analyst', 'reviewer', 'lab-admin')], loadChildren: () => import('./libraries/libraries.routes') },
      { path: 'instrument-keys', canActivate: [roleGuard('lab-admin')], loadChildren: () => import('./instrument-keys/instrument-keys.routes') },
      { path: '**', title: 'Not found · Ohmprint lab', component: NotFoundPage },
    ],
  },
];
