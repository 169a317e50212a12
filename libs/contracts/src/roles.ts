import { z } from 'zod';

/** Lab roles: staff of one lab may hold several of these. */
export const LAB_ROLES = ['lab-admin', 'intake-technician', 'analyst', 'reviewer'] as const;
/** Client roles: a client user holds exactly one, in one client organisation. */
export const CLIENT_ROLES = ['client-admin', 'client-member'] as const;
export const ROLES = ['platform-operator', ...LAB_ROLES, ...CLIENT_ROLES] as const;

export const RoleSchema = z.enum(ROLES);
export const LabRoleSchema = z.enum(LAB_ROLES);
export const ClientRoleSchema = z.enum(CLIENT_ROLES);

export type Role = z.infer<typeof RoleSchema>;
export type LabRole = z.infer<typeof LabRoleSchema>;
export type ClientRole = z.infer<typeof ClientRoleSchema>;

/** How roles read to people (screens, e-mails, messages); the codes above are for machines. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  'platform-operator': 'Platform operator',
  'lab-admin': 'Lab admin',
  'intake-technician': 'Intake technician',
  analyst: 'Analyst',
  reviewer: 'Reviewer',
  'client-admin': 'Client admin',
  'client-member': 'Client member',
};

/** Roles as a sentence reads them: "lab admin and reviewer". */
export function rolesInWords(roles: readonly Role[]): string {
  const words = roles.map((r) => ROLE_LABELS[r].toLowerCase());
  return words.length <= 1 ? (words[0] ?? '') : `${words.slice(0, -1).join(', ')} and ${words.at(-1)}`;
}
