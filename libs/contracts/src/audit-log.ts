import { z } from 'zod';
import { listQuery } from './paging';

export const AuditEventSchema = z.object({
  id: z.uuid(),
  action: z.string(),
  subjectType: z.string(),
  subjectId: z.string().nullable(),
  actor: z.object({ id: z.uuid(), displayName: z.string(), email: z.string() }).nullable(),
  details: z.record(z.string(), z.unknown()),
  createdAt: z.iso.datetime(),
});

/** `q` searches the action; `action` and `subjectType` filter exactly; newest first by default. */
export const AuditLogQuerySchema = listQuery(['createdAt', 'action'], 'desc').extend({
  action: z.string().trim().max(100).optional(),
  subjectType: z.string().trim().max(100).optional(),
  subjectId: z.string().trim().max(100).optional(),
});

export type AuditEventEntry = z.infer<typeof AuditEventSchema>;
export type AuditLogQuery = z.infer<typeof AuditLogQuerySchema>;
