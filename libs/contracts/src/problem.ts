import { z } from 'zod';

/** One invalid field of a request: `field` is a dotted path such as `firstAdmin.email`. */
export const FieldErrorSchema = z.object({ field: z.string(), message: z.string() });

/** Every API error body (RFC 9457 `application/problem+json`). */
/** Extension members (e.g. `shortfall` of an `insufficient-credits` problem) pass through. */
export const ProblemSchema = z.looseObject({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  detail: z.string().optional(),
  requestId: z.string().optional(),
  errors: z.array(FieldErrorSchema).optional(),
});

export type FieldError = z.infer<typeof FieldErrorSchema>;
export type Problem = z.infer<typeof ProblemSchema>;
