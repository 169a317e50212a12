import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { UserRefSchema } from './refs';
import { MatrixSchema } from './products';

/** Threshold estimators the engine offers (see the engine's threshold-estimator.ts). */
export const THRESHOLD_ESTIMATORS = ['lognormal-ml', 'empirical-type7'] as const;
export const ThresholdEstimatorSchema = z.enum(THRESHOLD_ESTIMATORS);
export type ThresholdEstimatorName = z.infer<typeof ThresholdEstimatorSchema>;
export const THRESHOLD_ESTIMATOR_LABELS: Record<ThresholdEstimatorName, string> = {
  'lognormal-ml': 'Lognormal fitted by maximum likelihood',
  'empirical-type7': 'Empirical quantile (Hyndman–Fan type 7)',
};

/**
 * How a lab turns raw spectra into a verdict. A library version freezes a copy of these, so a
 * later change to the lab's settings never changes an old result.
 */
export const MethodSettingsSchema = z
  .object({
    bandMinHz: z.number().positive(),
    bandMaxHz: z.number().positive(),
    gridPoints: z.number().int().min(8).max(400),
    referenceTemperatureC: z.number().min(0).max(40),
    /** Linear temperature coefficient, fraction per °C (0.02 = 2 %/°C, common practice). */
    temperatureCoefficientPerC: z.number().min(0).max(0.1),
    lowerQuantile: z.number().gt(0).lt(1),
    upperQuantile: z.number().gt(0).lt(1),
    minimumLots: z.number().int().min(3).max(1000),
    minimumReplicates: z.number().int().min(1).max(20),
    /** Equivalent-circuit model fitted to each sample (engine model name). */
    model: z.string().min(1).max(100),
    /** Largest Kramers–Kronig residual accepted, % of |Z| (a rule of thumb, set by the lab). */
    kkResidualLimitPercent: z.number().positive().max(50),
    /** Largest pairwise replicate distance accepted. */
    replicateDistanceLimit: z.number().positive().max(1),
    /**
     * Largest difference, °C, between a typed sample temperature and the one an export states
     * before the typed value needs a reason. A lab's choice (0.5 °C by default), not a standard.
     */
    temperatureMismatchLimitC: z.number().min(0).max(10).default(0.5),
    /**
     * Optional sub-band inside the band: when set, the grid (and so every distance) spans only it.
     * A low band often tells products apart as well, with simpler models.
     */
    subBandMinHz: z.number().positive().nullable().optional(),
    subBandMaxHz: z.number().positive().nullable().optional(),
    /** How T95/T99 are estimated (absent: the empirical type-7 quantile, as before the choice existed). */
    thresholdEstimator: z.enum(THRESHOLD_ESTIMATORS).optional(),
    /**
     * Publish limit: widest bootstrap interval of a threshold accepted, as a fraction of the
     * threshold (1 = the interval may span 100 % of the threshold's value).
     */
    maxThresholdIntervalWidth: z.number().positive().max(100).optional(),
  })
  .refine((m) => m.bandMaxHz > m.bandMinHz, { path: ['bandMaxHz'], message: 'must be above bandMinHz' })
  .refine((m) => m.upperQuantile > m.lowerQuantile, {
    path: ['upperQuantile'],
    message: 'must be above lowerQuantile',
  })
  .refine((m) => (m.subBandMinHz == null) === (m.subBandMaxHz == null), { path: ['subBandMaxHz'], message: 'give both ends of the sub-band, or neither' })
  .refine((m) => m.subBandMinHz == null || (m.subBandMinHz >= m.bandMinHz && m.subBandMinHz < (m.subBandMaxHz ?? 0)), {
    path: ['subBandMinHz'],
    message: 'must lie inside the band and below subBandMaxHz',
  })
  .refine((m) => m.subBandMaxHz == null || m.subBandMaxHz <= m.bandMaxHz, { path: ['subBandMaxHz'], message: 'must lie inside the band' });
export type MethodSettings = z.infer<typeof MethodSettingsSchema>;

const IntervalSchema = z.tuple([z.number(), z.number()]);

export const CalibrationSchema = z.object({
  t95: z.number(),
  t99: z.number(),
  lotCount: z.number().int(),
  /** Each lot's leave-one-out distance to its nearest other lot, ascending. */
  distances: z.array(z.number()),
  /** How the thresholds were estimated; calibrations from before the choice were empirical type 7. */
  estimator: ThresholdEstimatorSchema,
  /** Percentile-bootstrap intervals of T95 and T99; null on calibrations stored without them. */
  t95Interval: IntervalSchema.nullable(),
  t99Interval: IntervalSchema.nullable(),
  bootstrap: z.object({ resamples: z.number().int(), confidenceLevel: z.number(), seed: z.number().int() }).nullable(),
  /** The fitted lognormal (mean and standard deviation of ln distance), lognormal-ml only. */
  fit: z.object({ mu: z.number(), sigma: z.number() }).nullable(),
});
export type Calibration = z.infer<typeof CalibrationSchema>;

export const LIBRARY_VERSION_STATUSES = ['draft', 'published', 'retired'] as const;
export const LibraryVersionStatusSchema = z.enum(LIBRARY_VERSION_STATUSES);

export const LibraryVersionSummarySchema = z.object({
  id: z.uuid(),
  version: z.number().int().min(1),
  status: LibraryVersionStatusSchema,
  lotCount: z.number().int(),
  t95: z.number().nullable(),
  t99: z.number().nullable(),
  publishedAt: z.iso.datetime({ offset: true }).nullable(),
  publishedBy: UserRefSchema.nullable(),
  engineVersion: z.string(),
  /** A newer published version of the same library, when there is one. */
  supersededBy: z.number().int().nullable(),
  retiredAt: z.iso.datetime({ offset: true }).nullable(),
  thresholdEstimator: ThresholdEstimatorSchema.nullable(),
});
export type LibraryVersionSummary = z.infer<typeof LibraryVersionSummarySchema>;

export const LibraryItemSchema = z.object({
  id: z.uuid(),
  product: z.object({ id: z.uuid(), name: z.string(), matrix: MatrixSchema }),
  clientOrganisation: z.object({ id: z.uuid(), name: z.string() }),
  versions: z.array(LibraryVersionSummarySchema),
});
export type LibraryItem = z.infer<typeof LibraryItemSchema>;

export const LibraryListQuerySchema = listQuery(['product', 'client']);
export type LibraryListQuery = z.infer<typeof LibraryListQuerySchema>;
export const LibraryPageSchema = pageOf(LibraryItemSchema);
export type LibraryPage = z.infer<typeof LibraryPageSchema>;

export const ReferenceLotSchema = z.object({
  id: z.uuid(),
  lotCode: z.string(),
  producedOn: z.iso.date().nullable(),
  note: z.string(),
  included: z.boolean(),
  exclusionReason: z.string().nullable(),
});
export type ReferenceLot = z.infer<typeof ReferenceLotSchema>;

export const LibraryVersionDetailSchema = LibraryVersionSummarySchema.extend({
  libraryId: z.uuid(),
  product: z.object({ id: z.uuid(), name: z.string(), matrix: MatrixSchema }),
  method: MethodSettingsSchema,
  calibration: CalibrationSchema.nullable(),
  lots: z.array(ReferenceLotSchema),
  clientOrganisation: z.object({ id: z.uuid(), name: z.string() }),
  methodVersion: z.object({ id: z.uuid(), methodId: z.uuid(), name: z.string(), version: z.number().int() }).nullable(),
  retirementReason: z.string().nullable(),
  retiredBy: UserRefSchema.nullable(),
  includedLotCount: z.number().int(),
  excludedLotCount: z.number().int(),
  /** Why the version cannot be published yet (empty once it can, or once it is). */
  publishBlockers: z.array(z.object({ code: z.string(), message: z.string() })),
  /** What changed against the previous version of the library; null for version 1. */
  changes: z
    .object({
      previousVersion: z.number().int(),
      previousVersionId: z.uuid(),
      lotsAdded: z.array(z.string()),
      lotsRemoved: z.array(z.string()),
      methodDifferences: z.array(z.object({ field: z.string(), label: z.string(), before: z.string().nullable(), after: z.string().nullable() })),
      t95: z.object({ before: z.number().nullable(), after: z.number().nullable() }),
      t99: z.object({ before: z.number().nullable(), after: z.number().nullable() }),
    })
    .nullable(),
});
export type LibraryVersionDetail = z.infer<typeof LibraryVersionDetailSchema>;
