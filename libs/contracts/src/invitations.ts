import { z } from 'zod';
import { RoleSchema } from './roles';
import { DisplayNameSchema, EmailSchema, PasswordSchema, TokenSchema } from './common-fields';

export const InvitationTokenRequestSchema = z.object({ token: TokenSchema });

/** What the accept page shows before the invitee sets a password. */
export const InvitationPreviewSchema = z.object({
  email: z.string(),
  /** The name the inviter typed, if any: the accept form starts from it. */
  displayName: z.string().nullable(),
  labName: z.string(),
  clientOrganisationName: z.string().nullable(),
  roles: z.array(RoleSchema),
  expiresAt: z.iso.datetime(),
});

export const AcceptInvitationRequestSchema = z.object({
  token: TokenSchema,
  displayName: DisplayNameSchema,
  password: PasswordSchema,
});

/** An invitation as listed to the people who sent it (never with its token). */
export const InvitationSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  roles: z.array(RoleSchema),
  status: z.enum(['pending', 'accepted', 'expired', 'revoked']),
  expiresAt: z.iso.datetime(),
  createdAt: z.iso.datetime(),
});

export const FirstAdminSchema = z.object({ email: EmailSchema, displayName: DisplayNameSchema.optional() });

export type InvitationTokenRequest = z.infer<typeof InvitationTokenRequestSchema>;
export type InvitationPreview = z.infer<typeof InvitationPreviewSchema>;
export type AcceptInvitationRequest = z.infer<typeof AcceptInvitationRequestSchema>;
export type Invitation = z.infer<typeof InvitationSchema>;
