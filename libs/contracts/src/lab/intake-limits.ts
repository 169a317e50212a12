import { z } from 'zod';
import { MATRICES, type Matrix } from './products';

/** What intake accepts without a second look, per matrix: arrival temperature and sample age. */
export const IntakeLimitSchema = z
  .object({
    matrix: z.enum(MATRICES),
    /** Lowest acceptable temperature of the contents on arrival, °C. */
    minArrivalC: z.number().finite().min(-40).max(80),
    /** Highest acceptable temperature of the contents on arrival, °C. */
    maxArrivalC: z.number().finite().min(-40).max(80),
    /** Days from when the client obtained the sample to its arrival. */
    maxAgeDays: z.number().int().min(1).max(36500),
  })
  .refine((l) => l.minArrivalC < l.maxArrivalC, { message: 'the lowest temperature must be below the highest', path: ['maxArrivalC'] });
export type IntakeLimit = z.infer<typeof IntakeLimitSchema>;

export const IntakeLimitsSchema = z.object({
  limits: z.array(IntakeLimitSchema).refine((list) => new Set(list.map((l) => l.matrix)).size === list.length, 'each matrix appears once'),
  /** Where the values come from, shown beside them. */
  source: z.string(),
});
export type IntakeLimits = z.infer<typeof IntakeLimitsSchema>;
export const UpdateIntakeLimitsSchema = z.object({ limits: IntakeLimitsSchema.shape.limits });
export type UpdateIntakeLimits = z.infer<typeof UpdateIntakeLimitsSchema>;

/**
 * Defaults until a lab sets its own. Common practice for chilled and shelf-stable beverage samples,
 * not taken from a standard: chilled dairy stays at or below 8 °C and is tested within days; wine,
 * vinegar and spirits travel at cellar-to-room temperature and keep for years.
 */
export const DEFAULT_INTAKE_LIMITS: Readonly<Record<Matrix, Omit<IntakeLimit, 'matrix'>>> = {
  wine: { minArrivalC: 2, maxArrivalC: 25, maxAgeDays: 3650 },
  milk: { minArrivalC: 0, maxArrivalC: 8, maxAgeDays: 10 },
  juice: { minArrivalC: 0, maxArrivalC: 25, maxAgeDays: 365 },
  vinegar: { minArrivalC: 0, maxArrivalC: 30, maxAgeDays: 3650 },
  spirit: { minArrivalC: 0, maxArrivalC: 30, maxAgeDays: 3650 },
  brine: { minArrivalC: 0, maxArrivalC: 30, maxAgeDays: 730 },
};
export const DEFAULT_INTAKE_LIMITS_SOURCE =
  'Ohmprint’s defaults: common practice for chilled and shelf-stable beverage samples, not taken from a standard. Set your lab’s own.';
export const LAB_INTAKE_LIMITS_SOURCE = 'Set by the lab.';

/** A reason intake should look twice before accepting; `field` is the arrival field it concerns. */
export const IntakeWarningSchema = z.object({
  field: z.enum(['sealIntact', 'containerCondition', 'temperatureC', 'obtainedOn']),
  message: z.string(),
});
export type IntakeWarning = z.infer<typeof IntakeWarningSchema>;
