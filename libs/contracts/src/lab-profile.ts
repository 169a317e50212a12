import { z } from 'zod';
import { LabStatusSchema } from './labs';

/** The lab's own profile, printed on its reports. */
export const LabProfileSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  legalName: z.string(),
  address: z.string(),
  accreditationBody: z.string().nullable(),
  accreditationNumber: z.string().nullable(),
  turnaroundTargetDays: z.number().int(),
  status: LabStatusSchema,
  updatedAt: z.iso.datetime(),
});

export const UpdateLabProfileRequestSchema = z
  .object({
    name: z.string().trim().min(2).max(120),
    legalName: z.string().trim().min(2).max(200),
    address: z.string().trim().min(5).max(500),
    accreditationBody: z.string().trim().max(120).nullable(),
    accreditationNumber: z.string().trim().max(60).nullable(),
    turnaroundTargetDays: z.number().int().min(1).max(90),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'must change at least one field');

export type LabProfile = z.infer<typeof LabProfileSchema>;
export type UpdateLabProfileRequest = z.infer<typeof UpdateLabProfileRequestSchema>;
