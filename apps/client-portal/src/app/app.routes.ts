import type { Routes } from '@angular/router';
import { AppShell, NotFoundPage, ProfilePage, authRoutes, roleGuard, signedInGuard } from '@ohmprint/ui';

/**
 * Public pages (such as report verification) go before the shell; signed-in features are one line
 * each in `children`: their folder's `<feature>.routes.ts` default export.
 */
export const routes: Routes = [
  ...authRoutes,
  { path: 'verify', loadChildren: () => import('./verify/verify.routes') },
  {
    path: '',
    component: AppShell,
    canActivate: [signedInGuard],
    children: [
      { path: '', title: 'Home · Ohmprint', loadComponent: () => import('./home/client-home').then((m) => m.ClientHome) },
      { path: 'profile', title: 'Profile · Ohmprint', component: ProfilePage },
      { path: 'team', canActivate: [roleGuard('client-admin', 'client-member')], loadChildren: () => import('./team/team.routes') },
      { path: 'orders', canActivate: [roleGuard('client-admin', 'client-member')], loadChildren: () => import('./orders/orders.routes') },
      { path: 'credits', canActivate: [roleGuard('client-admin', 'client-member')], loadChildren: () => import('./credits/credits.routes') },
      { path: 'reports', canActivate: [roleGuard('client-admin', 'client-member')], loadChildren: () => import('./reports/reports.routes') },
      { path: '**', title: 'Not found · Ohmprint', component: NotFoundPage },
    ],
  },
];
