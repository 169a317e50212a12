import { z } from 'zod';

export const UserRefSchema = z.object({ id: z.uuid(), displayName: z.string() });
export type UserRef = z.infer<typeof UserRefSchema>;
