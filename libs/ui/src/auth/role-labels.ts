import { ROLE_LABELS, type Role } from '@ohmprint/contracts';

/** How roles read on screen: one vocabulary, kept in the contracts so e-mails read the same. */
export { ROLE_LABELS };

export function roleList(roles: readonly Role[]): string {
  return roles.map((r) => ROLE_LABELS[r]).join(', ');
}
