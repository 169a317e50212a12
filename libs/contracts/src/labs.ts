import { z } from 'zod';
import { FirstAdminSchema } from './invitations';
import { listQuery } from './paging';

export const LAB_STATUSES = ['active', 'suspended'] as const;
export const LabStatusSchema = z.enum(LAB_STATUSES);

/** A lab tenant as the platform operator sees it: no sample data, only the tenant's profile. */
export const LabSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  legalName: z.string(),
  address: z.string(),
  accreditationBody: z.string().nullable(),
  accreditationNumber: z.string().nullable(),
  turnaroundTargetDays: z.number().int(),
  status: LabStatusSchema,
  staffCount: z.number().int().min(0),
  createdAt: z.iso.datetime(),
});

export const LabListQuerySchema = listQuery(['name', 'createdAt', 'status']);

export const CreateLabRequestSchema = z.object({
  name: z.string().trim().min(2, 'must be at least 2 characters').max(120),
  legalName: z.string().trim().min(2, 'must be at least 2 characters').max(200),
  address: z.string().trim().min(5, 'must be at least 5 characters').max(500),
  accreditationBody: z.string().trim().max(120).optional(),
  accreditationNumber: z.string().trim().max(60).optional(),
  turnaroundTargetDays: z.number().int().min(1).max(90).default(10),
  firstAdmin: FirstAdminSchema,
});

export const ChangeLabStatusRequestSchema = z.object({
  status: LabStatusSchema,
  reason: z.string().trim().min(3, 'must say why (at least 3 characters)').max(500),
});

export type LabStatus = z.infer<typeof LabStatusSchema>;
export type LabSummary = z.infer<typeof LabSummarySchema>;
export type CreateLabRequest = z.infer<typeof CreateLabRequestSchema>;
export type ChangeLabStatusRequest = z.infer<typeof ChangeLabStatusRequestSchema>;
