import { z } from 'zod';
import { LabRoleSchema } from './roles';
import { EmailSchema } from './common-fields';
import { listQuery } from './paging';

export const LabRolesSchema = z
  .array(LabRoleSchema)
  .min(1, 'must name at least one role')
  .refine((roles) => new Set(roles).size === roles.length, 'must not repeat a role');

export const StaffMemberSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(LabRoleSchema),
  status: z.enum(['active', 'deactivated']),
  createdAt: z.iso.datetime(),
});

export const StaffListQuerySchema = listQuery(['displayName', 'email', 'createdAt']);
export const InviteStaffRequestSchema = z.object({ email: EmailSchema, roles: LabRolesSchema });
export const ChangeStaffRolesRequestSchema = z.object({ roles: LabRolesSchema });

export type StaffMember = z.infer<typeof StaffMemberSchema>;
export type InviteStaffRequest = z.infer<typeof InviteStaffRequestSchema>;
export type ChangeStaffRolesRequest = z.infer<typeof ChangeStaffRolesRequestSchema>;
