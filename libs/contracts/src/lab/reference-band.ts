import { z } from 'zod';

/**
 * The spread of a published version's lots at each grid frequency (full range: min and max), in
 * Ω·cm and degrees. Computed once when the version is published and stored with it, so a result
 * screen or report never needs the lots themselves. Modulus and phase are taken lot by lot.
 */
export const ReferenceBandPointsSchema = z.object({
  frequencyHz: z.array(z.number()),
  reLow: z.array(z.number()),
  reHigh: z.array(z.number()),
  imLow: z.array(z.number()),
  imHigh: z.array(z.number()),
  modulusLow: z.array(z.number()),
  modulusHigh: z.array(z.number()),
  phaseLowDeg: z.array(z.number()),
  phaseHighDeg: z.array(z.number()),
  /** How many lots the band spans. */
  lotCount: z.number().int().min(0),
});
export type ReferenceBandPoints = z.infer<typeof ReferenceBandPointsSchema>;

/** `GET /lab/library-versions/:id/reference-band`: the stored band with what normalising a replicate needs. */
export const ReferenceBandViewSchema = z.object({
  libraryVersionId: z.uuid(),
  productName: z.string(),
  version: z.number().int().min(1),
  impedanceUnit: z.literal('Ω·cm'),
  referenceTemperatureC: z.number(),
  temperatureCoefficientPerC: z.number(),
  band: ReferenceBandPointsSchema,
});
export type ReferenceBandView = z.infer<typeof ReferenceBandViewSchema>;
