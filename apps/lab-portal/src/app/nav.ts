import type { NavItem } from '@ohmprint/ui';

/** Side navigation of the lab portal; the shell shows each entry to the roles listed. */
export const LAB_NAV: readonly NavItem[] = [
  { label: 'Home', icon: 'home', path: '/', exact: true },
  { label: 'Staff', icon: 'group', path: '/staff', roles: ['lab-admin'] },
  { label: 'Client organisations', icon: 'storefront', path: '/clients', roles: ['lab-admin'] },
  { label: 'Labs', icon: 'domain', path: '/labs', roles: ['platform-operator'] },
];
