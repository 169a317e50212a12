import type { NavItem } from '@ohmprint/ui';

/** Side navigation of the client portal; the shell shows each entry to the roles listed. */
export const CLIENT_NAV: readonly NavItem[] = [
  { label: 'Home', icon: 'home', path: '/', exact: true },
  { label: 'Orders', icon: 'shopping_cart', path: '/orders', roles: ['client-admin', 'client-member'] },
  { label: 'Reports', icon: 'description', path: '/reports', roles: ['client-admin', 'client-member'] },
  { label: 'Credits', icon: 'toll', path: '/credits', roles: ['client-admin', 'client-member'] },
  { label: 'Team', icon: 'group', path: '/team', roles: ['client-admin', 'client-member'] },
];
