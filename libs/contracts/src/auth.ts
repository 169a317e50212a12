import { z } from 'zod';
import { RoleSchema } from './roles';
import { DisplayNameSchema, EmailSchema, PasswordSchema, TokenSchema } from './common-fields';

export const NamedRefSchema = z.object({ id: z.uuid(), name: z.string() });

/** The signed-in user as the portals see them. */
export const MeSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(RoleSchema),
  lab: NamedRefSchema.nullable(),
  clientOrganisation: NamedRefSchema.nullable(),
});

export const SignInRequestSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, 'is required').max(200),
});

export const SessionResponseSchema = z.object({ accessToken: z.string(), user: MeSchema });

export const UpdateMeRequestSchema = z.object({ displayName: DisplayNameSchema });

export const ChangePasswordRequestSchema = z.object({
  currentPassword: z.string().min(1, 'is required').max(200),
  newPassword: PasswordSchema,
});

export const PasswordResetRequestSchema = z.object({ email: EmailSchema });

export const PasswordResetSchema = z.object({ token: TokenSchema, newPassword: PasswordSchema });

export type Me = z.infer<typeof MeSchema>;
export type SignInRequest = z.infer<typeof SignInRequestSchema>;
export type SessionResponse = z.infer<typeof SessionResponseSchema>;
export type UpdateMeRequest = z.infer<typeof UpdateMeRequestSchema>;
export type ChangePasswordRequest = z.infer<typeof ChangePasswordRequestSchema>;
export type PasswordResetRequest = z.infer<typeof PasswordResetRequestSchema>;
export type PasswordReset = z.infer<typeof PasswordResetSchema>;
