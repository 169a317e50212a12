import { z } from 'zod';

/**
 * Chemistry a producer or the lab knows for a lot, each value in the unit named here. Used for
 * enrolment (declared by the producer), library lots, and method validation (correlation with the
 * fitted model parameters).
 */
export const CHEMISTRY_FIELDS = {
  alcoholPercentVolume: { label: 'Alcohol', unit: '% vol', min: 0, max: 100 },
  pH: { label: 'pH', unit: '', min: 0, max: 14 },
  titratableAcidityGPerL: { label: 'Titratable acidity', unit: 'g/L', min: 0, max: 100 },
  densityGPerMl: { label: 'Density', unit: 'g/mL', min: 0.5, max: 2 },
  sugarGPerL: { label: 'Sugar', unit: 'g/L', min: 0, max: 1000 },
  fatGPer100G: { label: 'Fat', unit: 'g/100 g', min: 0, max: 100 },
  proteinGPer100G: { label: 'Protein', unit: 'g/100 g', min: 0, max: 100 },
} as const;

export type ChemistryField = keyof typeof CHEMISTRY_FIELDS;
export const CHEMISTRY_FIELD_NAMES = Object.keys(CHEMISTRY_FIELDS) as ChemistryField[];

const value = (field: ChemistryField) => {
  const { label, unit, min, max } = CHEMISTRY_FIELDS[field];
  const shown = unit ? `${label} (${unit})` : label;
  return z.number().finite().min(min, `${shown} is at least ${min}`).max(max, `${shown} is at most ${max}`).optional();
};

export const ChemistrySchema = z.strictObject(
  Object.fromEntries(CHEMISTRY_FIELD_NAMES.map((f) => [f, value(f)])) as { [K in ChemistryField]: ReturnType<typeof value> },
);
export type Chemistry = z.infer<typeof ChemistrySchema>;

export const SAMPLE_KINDS = ['check', 'reference-lot'] as const;
export const SampleKindSchema = z.enum(SAMPLE_KINDS);
export type SampleKind = z.infer<typeof SampleKindSchema>;

/** What the producer declares about an authentic lot it enrols (stored with the sample as `reference_lot`). */
export const ReferenceLotDeclarationSchema = z.object({
  lotCode: z.string().trim().min(1).max(60),
  /** ISO date (YYYY-MM-DD). */
  producedOn: z.iso.date(),
  volumeMl: z.number().finite().positive().max(100_000),
  chemistry: ChemistrySchema.default({}),
});
export type ReferenceLotDeclaration = z.infer<typeof ReferenceLotDeclarationSchema>;
