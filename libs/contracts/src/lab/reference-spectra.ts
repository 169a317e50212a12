import { z } from 'zod';

/**
 * The lots of a published library version as the analysis sees them: normalised (per cell
 * constant, referred to the method's temperature) and resampled onto the version's grid, so a
 * portal can shade the reference band behind a sample without recomputing anything.
 */
export const ReferenceSpectraSchema = z.object({
  libraryVersionId: z.uuid(),
  productName: z.string(),
  version: z.number().int().min(1),
  /** Specific impedance after dividing by the cell constant. */
  impedanceUnit: z.literal('Ω·cm'),
  referenceTemperatureC: z.number(),
  temperatureCoefficientPerC: z.number(),
  /** The version's method grid, ascending, hertz. */
  frequencyHz: z.array(z.number()),
  lots: z.array(z.object({ lotId: z.uuid(), lotCode: z.string(), re: z.array(z.number()), im: z.array(z.number()) })),
});
export type ReferenceSpectra = z.infer<typeof ReferenceSpectraSchema>;
