import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { MethodSettingsSchema, THRESHOLD_ESTIMATOR_LABELS, type MethodSettings } from './libraries';
import { MatrixSchema } from './products';
import { UserRefSchema } from './refs';

/** Plain-words names of the method's settings, for the difference list and the method screen. */
export const METHOD_SETTING_LABELS: Record<keyof MethodSettings, string> = {
  bandMinHz: 'Band from (Hz)',
  bandMaxHz: 'Band to (Hz)',
  subBandMinHz: 'Sub-band from (Hz)',
  subBandMaxHz: 'Sub-band to (Hz)',
  gridPoints: 'Grid points',
  referenceTemperatureC: 'Reference temperature (°C)',
  temperatureCoefficientPerC: 'Temperature coefficient (per °C)',
  minimumReplicates: 'Minimum replicates',
  replicateDistanceLimit: 'Replicate agreement limit (distance)',
  kkResidualLimitPercent: 'Kramers–Kronig limit (% of |Z|)',
  temperatureMismatchLimitC: 'Typed against file temperature, largest difference (°C)',
  model: 'Model',
  lowerQuantile: 'Lower threshold quantile',
  upperQuantile: 'Upper threshold quantile',
  thresholdEstimator: 'Threshold estimator',
  maxThresholdIntervalWidth: 'Widest threshold interval (fraction of the threshold)',
  minimumLots: 'Minimum lots per library',
};

/** A setting as the difference list prints it. */
export function methodSettingText(field: keyof MethodSettings, value: unknown): string | null {
  if (value === undefined || value === null) return null;
  if (field === 'thresholdEstimator') return THRESHOLD_ESTIMATOR_LABELS[value as keyof typeof THRESHOLD_ESTIMATOR_LABELS] ?? String(value);
  return String(value);
}

/** The settings that differ between two versions, in the order of METHOD_SETTING_LABELS. */
export function methodDifferences(before: MethodSettings | null, after: MethodSettings): MethodDifference[] {
  if (!before) return [];
  return (Object.keys(METHOD_SETTING_LABELS) as (keyof MethodSettings)[])
    .map((field) => ({ field, label: METHOD_SETTING_LABELS[field], before: methodSettingText(field, before[field]), after: methodSettingText(field, after[field]) }))
    .filter((d) => d.before !== d.after);
}

export const MethodDifferenceSchema = z.object({ field: z.string(), label: z.string(), before: z.string().nullable(), after: z.string().nullable() });
export type MethodDifference = z.infer<typeof MethodDifferenceSchema>;

export const MethodVersionSummarySchema = z.object({
  id: z.uuid(),
  version: z.number().int().min(1),
  note: z.string(),
  createdAt: z.iso.datetime({ offset: true }),
  createdBy: UserRefSchema.nullable(),
  /** Library versions built under it. */
  libraryVersionCount: z.number().int(),
  /** True once a published library version or an issued report relies on it: it can no longer change. */
  locked: z.boolean(),
  lockReason: z.string().nullable(),
});
export type MethodVersionSummary = z.infer<typeof MethodVersionSummarySchema>;

export const MethodItemSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  matrix: MatrixSchema,
  /** Newest first. */
  versions: z.array(MethodVersionSummarySchema),
});
export type MethodItem = z.infer<typeof MethodItemSchema>;

export const MethodListQuerySchema = listQuery(['name', 'matrix']);
export type MethodListQuery = z.infer<typeof MethodListQuerySchema>;
export const MethodPageSchema = pageOf(MethodItemSchema);
export type MethodPage = z.infer<typeof MethodPageSchema>;

const Note = z.string().trim().max(2000).default('');

export const CreateMethodSchema = z.object({
  name: z.string().trim().min(1).max(120),
  matrix: MatrixSchema,
  settings: MethodSettingsSchema,
  note: Note,
});
export type CreateMethod = z.infer<typeof CreateMethodSchema>;

export const MethodVersionInputSchema = z.object({ settings: MethodSettingsSchema, note: Note });
export type MethodVersionInput = z.infer<typeof MethodVersionInputSchema>;

export const MethodVersionDetailSchema = MethodVersionSummarySchema.extend({
  methodId: z.uuid(),
  name: z.string(),
  matrix: MatrixSchema,
  settings: MethodSettingsSchema,
  previousVersion: z.number().int().nullable(),
  /** What differs from the previous version (empty for version 1). */
  differences: z.array(MethodDifferenceSchema),
});
export type MethodVersionDetail = z.infer<typeof MethodVersionDetailSchema>;

/** Spectra the model preview can be tried on: the lab's latest measured replicates. */
export const PreviewReplicateSchema = z.object({
  replicateId: z.uuid(),
  sampleCode: z.string(),
  replicateNumber: z.number().int(),
  fileName: z.string(),
  uploadedAt: z.iso.datetime({ offset: true }),
});
export const PreviewReplicateListSchema = z.array(PreviewReplicateSchema);
export type PreviewReplicate = z.infer<typeof PreviewReplicateSchema>;

export const ModelPreviewRequestSchema = z.object({
  replicateId: z.uuid(),
  settings: MethodSettingsSchema,
});
export type ModelPreviewRequest = z.infer<typeof ModelPreviewRequestSchema>;

export const ModelPreviewSchema = z.object({
  model: z.string(),
  modelLabel: z.string(),
  sampleCode: z.string(),
  replicateNumber: z.number().int(),
  converged: z.boolean(),
  reason: z.string().nullable(),
  chiSquare: z.number().nullable(),
  parameters: z.array(z.object({ name: z.string(), value: z.number(), standardError: z.number().nullable(), unit: z.string() })),
  impedanceUnit: z.string(),
  frequencyHz: z.array(z.number()),
  measured: z.object({ re: z.array(z.number()), im: z.array(z.number()) }),
  fitted: z.object({ re: z.array(z.number()), im: z.array(z.number()) }).nullable(),
});
export type ModelPreview = z.infer<typeof ModelPreviewSchema>;

/** The engine's model catalog, for the method form's model choice. */
export const ModelCatalogSchema = z.array(z.object({ name: z.string(), label: z.string(), parameters: z.array(z.string()) }));
export type ModelCatalog = z.infer<typeof ModelCatalogSchema>;
