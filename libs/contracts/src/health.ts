import { z } from 'zod';

export const HealthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.enum(['ok', 'unreachable']),
  version: z.string(),
});

export type Health = z.infer<typeof HealthSchema>;
