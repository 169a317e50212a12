import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { UserRefSchema } from './refs';
import { MethodSettingsSchema, ThresholdEstimatorSchema } from './libraries';
import { SpectrumPointsSchema } from './measurements';
import { ReferenceBandPointsSchema } from './reference-band';

export const VERDICTS = ['consistent', 'inconclusive', 'not-consistent', 'no-verdict'] as const;
export const VerdictSchema = z.enum(VERDICTS);
export type Verdict = z.infer<typeof VerdictSchema>;

export const ANALYSIS_STATUSES = ['draft', 'submitted', 'approved', 'returned', 'superseded'] as const;
export const AnalysisStatusSchema = z.enum(ANALYSIS_STATUSES);
export type AnalysisStatus = z.infer<typeof AnalysisStatusSchema>;

export const RunAnalysisSchema = z.object({ libraryVersionId: z.uuid() });
export type RunAnalysis = z.infer<typeof RunAnalysisSchema>;

/** What a library version states about its thresholds; analyses and reports repeat it. */
export const ThresholdStatementSchema = z.object({
  estimator: ThresholdEstimatorSchema,
  lotCount: z.number().int(),
  t95Interval: z.tuple([z.number(), z.number()]).nullable(),
  t99Interval: z.tuple([z.number(), z.number()]).nullable(),
  confidenceLevel: z.number().nullable(),
  resamples: z.number().int().nullable(),
});
export type ThresholdStatement = z.infer<typeof ThresholdStatementSchema>;

/** Nearest lots an analysis keeps and returns: the map draws them, the list shows the first ten. */
export const NEAREST_LOTS = 59;

export const LotDistanceSchema = z.object({ lotId: z.uuid(), lotCode: z.string(), distance: z.number() });
export type LotDistance = z.infer<typeof LotDistanceSchema>;

export const QualityFlagSchema = z.object({
  code: z.enum([
    'kk-failed',
    'poor-replicate-agreement',
    'band-not-covered',
    'too-few-replicates',
    'too-few-lots',
    'fit-poor',
    'resembles-other-product',
  ]),
  severity: z.enum(['warning', 'blocking']),
  message: z.string(),
  /** The report's wording when it must differ from the lab's (another client's product is not named to this client). */
  reportMessage: z.string().optional(),
});
export type QualityFlag = z.infer<typeof QualityFlagSchema>;

export const FittedParameterSchema = z.object({
  /** The model's own parameter name, as in its definition (rInf, tau, q …). */
  name: z.string(),
  /** What a reader calls it, with its symbol ("Relaxation time τ"); absent on lab-defined models. */
  description: z.string().optional(),
  value: z.number(),
  standardError: z.number().nullable(),
  unit: z.string(),
});
export type FittedParameter = z.infer<typeof FittedParameterSchema>;

/**
 * How a fit scales residuals before squaring: by |Z| at each frequency (modulus), by the part
 * itself (proportional), or not at all (unit: large impedances dominate).
 */
export const FitWeightingSchema = z.enum(['modulus', 'proportional', 'unit']);
export type FitWeighting = z.infer<typeof FitWeightingSchema>;

/** The numbers behind a verdict; every one comes from the spectral engine. */
export const AnalysisResultSchema = z.object({
  verdict: VerdictSchema,
  nearest: LotDistanceSchema.nullable(),
  t95: z.number().nullable(),
  t99: z.number().nullable(),
  /** Share of the library's calibration distances above the sample's nearest distance, 0–1. */
  typicality: z.number().nullable(),
  /**
   * The nearest lots, nearest first (at most `NEAREST_LOTS`; older analyses hold every lot). Every
   * lot's distance pages through `GET /lab/analyses/:id/lot-distances`.
   */
  distances: z.array(LotDistanceSchema),
  /** How many lots the sample was scored against (absent on older analyses: `distances.length`). */
  lotCount: z.number().int().min(0).optional(),
  /** Classical MDS of lots plus sample; axes are arbitrary in sign. */
  map: z.object({
    sample: z.tuple([z.number(), z.number()]),
    lots: z.array(z.object({ lotId: z.uuid(), lotCode: z.string(), x: z.number(), y: z.number() })),
    /** Each axis's eigenvalue over the sum of the positive eigenvalues (0–1); absent on older analyses. */
    axisShares: z.tuple([z.number(), z.number()]).optional(),
  }),
  /** Histogram of the calibration distances, for plotting with T95/T99 and the sample's distance. */
  histogram: z.object({
    binEdges: z.array(z.number()),
    counts: z.array(z.number().int()),
    /** The thresholds and the sample's nearest distance drawn over the bars, and the bin it falls in (absent on older analyses). */
    t95: z.number().nullable().optional(),
    t99: z.number().nullable().optional(),
    sampleDistance: z.number().nullable().optional(),
    sampleBin: z.number().int().nullable().optional(),
  }),
  fit: z
    .object({
      model: z.string(),
      parameters: z.array(FittedParameterSchema),
      chiSquare: z.number(),
      converged: z.boolean(),
      /** How residuals were scaled in χ² (absent on older analyses). */
      weighting: FitWeightingSchema.optional(),
      /** The fitted model evaluated at `sampleSpectrum.frequencyHz` (Ω·cm), to draw over the data; absent on older analyses. */
      curve: z.object({ re: z.array(z.number()), im: z.array(z.number()) }).optional(),
    })
    .nullable(),
  qualityFlags: z.array(QualityFlagSchema),
  replicateIds: z.array(z.uuid()),
  /** How the version's thresholds were estimated and how sure they are (absent on older analyses). */
  thresholds: ThresholdStatementSchema.nullable().optional(),
});
export type AnalysisResult = z.infer<typeof AnalysisResultSchema>;

/** One replicate's measurement temperature and where it came from (see `TemperatureSource`). */
export const MeasurementTemperatureSchema = z.object({
  replicateNumber: z.number().int(),
  fileName: z.string(),
  temperatureC: z.number(),
  source: z.enum(['entered', 'file', 'entered-over-file']),
});
export type MeasurementTemperature = z.infer<typeof MeasurementTemperatureSchema>;

export const AnalysisSchema = z.object({
  id: z.uuid(),
  sample: z.object({ id: z.uuid(), code: z.string() }),
  libraryVersion: z.object({ id: z.uuid(), version: z.number().int(), productName: z.string(), retired: z.boolean().optional() }),
  status: AnalysisStatusSchema,
  result: AnalysisResultSchema,
  method: MethodSettingsSchema,
  /** The replicates' average as scored: normalised (Ω·cm) and on the version's grid. */
  sampleSpectrum: SpectrumPointsSchema,
  engineVersion: z.string(),
  remarks: z.string(),
  analyst: UserRefSchema,
  createdAt: z.iso.datetime({ offset: true }),
  submittedAt: z.iso.datetime({ offset: true }).nullable(),
  /** The scored replicates' measurement temperatures, before referral to `method.referenceTemperatureC`. */
  measurementTemperatures: z.array(MeasurementTemperatureSchema).optional(),
  /**
   * The producer's own lot code (from its reference-lot declaration) for the library lots this
   * analysis names, by lot id; lots without a declaration are absent. Read when the analysis is shown.
   */
  producerLotCodes: z.record(z.string(), z.string()).optional(),
  /**
   * The lot the client claimed for this check sample, and whether the nearest library lot is that
   * lot (compared with the nearest lot's producer code; null when the nearest lot has none or there
   * is no nearest lot). Null when the client claimed no lot.
   */
  claimedLot: z.object({ lotCode: z.string(), nearestIsClaimed: z.boolean().nullable() }).nullable().optional(),
  /** The revoked report of this sample that a report from this analysis would follow, if any. */
  followsRevokedReport: z.string().nullable().optional(),
  /** The version's reference band (stored when it was published), drawn behind the sample. */
  referenceBand: ReferenceBandPointsSchema.nullable().optional(),
  reviews: z.array(
    z.object({
      id: z.uuid(),
      decision: z.enum(['approved', 'returned']),
      comments: z.string(),
      reviewer: UserRefSchema,
      decidedAt: z.iso.datetime({ offset: true }),
    }),
  ),
});
export type Analysis = z.infer<typeof AnalysisSchema>;

export const AnalysisListItemSchema = z.object({
  id: z.uuid(),
  sampleCode: z.string(),
  sampleId: z.uuid(),
  productName: z.string(),
  status: AnalysisStatusSchema,
  verdict: VerdictSchema,
  analyst: UserRefSchema,
  createdAt: z.iso.datetime({ offset: true }),
  submittedAt: z.iso.datetime({ offset: true }).nullable(),
});
export type AnalysisListItem = z.infer<typeof AnalysisListItemSchema>;

export const AnalysisListQuerySchema = listQuery(['createdAt', 'submittedAt', 'sample', 'status'], 'desc').extend({
  status: AnalysisStatusSchema.optional(),
  sampleId: z.uuid().optional(),
});
export type AnalysisListQuery = z.infer<typeof AnalysisListQuerySchema>;
export const AnalysisPageSchema = pageOf(AnalysisListItemSchema);
export type AnalysisPage = z.infer<typeof AnalysisPageSchema>;

export const UpdateRemarksSchema = z.object({ remarks: z.string().trim().max(5000) });
export type UpdateRemarks = z.infer<typeof UpdateRemarksSchema>;

/** Recomputed from the stored inputs and compared number by number. */
export const ReproduceCheckSchema = z.object({
  reproduced: z.boolean(),
  storedEngineVersion: z.string(),
  currentEngineVersion: z.string(),
  /** Largest absolute difference over distances, thresholds and map coordinates. */
  maxAbsoluteDifference: z.number(),
  differences: z.array(z.object({ field: z.string(), stored: z.unknown(), recomputed: z.unknown() })),
});
export type ReproduceCheck = z.infer<typeof ReproduceCheckSchema>;
