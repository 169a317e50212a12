import type { NavItem } from '@ohmprint/ui';

/** Side navigation of the lab portal; the shell shows each entry to the roles listed. */
export const LAB_NAV: readonly NavItem[] = [
  { label: 'Home', icon: 'home', path: '/', exact: true },
  { label: 'Work queue', icon: 'pending_actions', path: '/queue', roles: ['intake-technician', 'analyst', 'reviewer', 'lab-admin'] },
  { label: 'Receive samples', icon: 'qr_code_scanner', path: '/intake', roles: ['intake-technician'] },
  { label: 'Reviews', icon: 'rate_review', path: '/reviews', roles: ['reviewer'] },
  { label: 'Reports', icon: 'description', path: '/reports', roles: ['reviewer', 'lab-admin', 'analyst'] },
  { label: 'Reference libraries', icon: 'library_books', path: '/libraries', exact: true, roles: ['analyst', 'reviewer', 'lab-admin'] },
  { label: 'Methods', icon: 'tune', path: '/libraries/methods', roles: ['analyst', 'reviewer', 'lab-admin'] },
  { label: 'Intake limits', icon: 'device_thermostat', path: '/intake-limits', roles: ['lab-admin'] },
  { label: 'Instrument keys', icon: 'key', path: '/instrument-keys', roles: ['lab-admin'] },
  { label: 'Staff', icon: 'group', path: '/staff', roles: ['lab-admin'] },
  { label: 'Billing', icon: 'payments', path: '/billing', roles: ['lab-admin'] },
  { label: 'Client organisations', icon: 'storefront', path: '/clients', roles: ['lab-admin'] },
  { label: 'Labs', icon: 'domain', path: '/labs', roles: ['platform-operator'] },
];
