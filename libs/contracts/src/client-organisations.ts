import { z } from 'zod';
import { ClientRoleSchema } from './roles';
import { EmailSchema } from './common-fields';
import { FirstAdminSchema } from './invitations';
import { listQuery } from './paging';

export const ClientOrganisationSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  contactEmail: z.string().nullable(),
  memberCount: z.number().int().min(0),
  createdAt: z.iso.datetime(),
});

export const ClientOrganisationListQuerySchema = listQuery(['name', 'createdAt']);

export const CreateClientOrganisationRequestSchema = z.object({
  name: z.string().trim().min(2, 'must be at least 2 characters').max(160),
  contactEmail: EmailSchema.optional(),
  firstAdmin: FirstAdminSchema,
});

export const ClientTeamMemberSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  role: ClientRoleSchema,
  createdAt: z.iso.datetime(),
});

export const ClientTeamListQuerySchema = listQuery(['displayName', 'email', 'createdAt']);
export const InviteClientMemberRequestSchema = z.object({ email: EmailSchema, role: ClientRoleSchema.default('client-member') });

export type ClientOrganisation = z.infer<typeof ClientOrganisationSchema>;
export type CreateClientOrganisationRequest = z.infer<typeof CreateClientOrganisationRequestSchema>;
export type ClientTeamMember = z.infer<typeof ClientTeamMemberSchema>;
export type InviteClientMemberRequest = z.infer<typeof InviteClientMemberRequestSchema>;
