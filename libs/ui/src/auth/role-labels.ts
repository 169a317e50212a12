import type { Role } from '@ohmprint/contracts';

/** How roles read on screen. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  'platform-operator': 'Platform operator',
  'lab-admin': 'Lab admin',
  'intake-technician': 'Intake technician',
  analyst: 'Analyst',
  reviewer: 'Reviewer',
  'client-admin': 'Client admin',
  'client-member': 'Client member',
};

export function roleList(roles: readonly Role[]): string {
  return roles.map((r) => ROLE_LABELS[r]).join(', ');
}
