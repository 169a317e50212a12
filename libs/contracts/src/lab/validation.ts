import { z } from 'zod';
import { UserRefSchema } from './refs';

/** Method validation and control standards: instruments, cells, KCl runs, control charts, studies. */

export const CreateInstrumentSchema = z.object({
  name: z.string().trim().min(1).max(120),
  model: z.string().trim().max(120).default(''),
  serialNumber: z.string().trim().max(120).default(''),
});
export type CreateInstrument = z.infer<typeof CreateInstrumentSchema>;

export const CreateCellSchema = z.object({
  name: z.string().trim().min(1).max(120),
  /** cm⁻¹, from the maker's data sheet. */
  nominalConstantPerCm: z.number().positive().max(1000),
});
export type CreateCell = z.infer<typeof CreateCellSchema>;

export const CONCENTRATION_BASES = ['molal', 'molar'] as const;
export const ConcentrationBasisSchema = z.enum(CONCENTRATION_BASES);

/**
 * Text fields of a KCl standard run (multipart; the spectrum goes in `file`). Without
 * `certifiedConductivityAt25UsPerCm` the tabulated value for the concentration is used.
 */
export const StandardRunFieldsSchema = z.object({
  concentration: z.coerce.number().positive().max(5).meta({ description: 'mol/kg (molal) or mol/L (molar)' }),
  basis: ConcentrationBasisSchema,
  temperatureC: z.coerce.number().min(0).max(50),
  certifiedConductivityAt25UsPerCm: z.coerce.number().positive().max(1e6).optional(),
  measuredAt: z.iso.datetime({ offset: true }).optional(),
});
export type StandardRunFields = z.infer<typeof StandardRunFieldsSchema>;

export const CONTROL_RULES = ['beyond-3-sigma', 'run-one-side', 'trend'] as const;
export const ControlRuleSchema = z.enum(CONTROL_RULES);
export type ControlRuleName = z.infer<typeof ControlRuleSchema>;

export const ControlSignalSchema = z.object({ rule: ControlRuleSchema, message: z.string() });

export const StandardRunSchema = z.object({
  id: z.uuid(),
  standardName: z.string(),
  concentration: z.number().nullable(),
  basis: ConcentrationBasisSchema.nullable(),
  temperatureC: z.number(),
  /** κ of the standard at the run's temperature, µS/cm. */
  standardConductivityUsPerCm: z.number(),
  conductivitySource: z.string().nullable(),
  plateauResistanceOhm: z.number(),
  resistanceSource: z.enum(['plateau', 'fit', 'entered']),
  cellConstantPerCm: z.number(),
  fileName: z.string().nullable(),
  measuredAt: z.iso.datetime({ offset: true }),
  measuredBy: UserRefSchema,
  inBaseline: z.boolean(),
  signals: z.array(ControlSignalSchema),
});
export type StandardRun = z.infer<typeof StandardRunSchema>;

/** Whether a cell may be used: blocked while its newest run breaks a rule. */
export const CellControlStatusSchema = z.object({
  state: z.enum(['establishing', 'in-control', 'out-of-control']),
  /** Plain words for the measurement screen. */
  message: z.string(),
  brokenRules: z.array(ControlSignalSchema),
});
export type CellControlStatus = z.infer<typeof CellControlStatusSchema>;

export const ControlChartSchema = z.object({
  cell: z.object({ id: z.uuid(), name: z.string(), nominalConstantPerCm: z.number() }),
  centre: z.number().nullable(),
  sigma: z.number().nullable(),
  upperLimit: z.number().nullable(),
  lowerLimit: z.number().nullable(),
  baselineCount: z.number().int(),
  baselineRule: z.string(),
  rules: z.array(z.object({ rule: ControlRuleSchema, description: z.string() })),
  status: CellControlStatusSchema,
  /** Oldest first. */
  runs: z.array(StandardRunSchema),
  /** Uploads refused while the cell was out of control, newest first (at most 50). */
  refusals: z.array(z.object({ at: z.iso.datetime({ offset: true }), sampleCode: z.string(), rule: z.string() })),
});
export type ControlChartView = z.infer<typeof ControlChartSchema>;

export const CorrelationCellSchema = z.object({
  parameter: z.string(),
  chemistry: z.string(),
  r: z.number().nullable(),
  p: z.number().nullable(),
  n: z.number().int(),
});
export type CorrelationCell = z.infer<typeof CorrelationCellSchema>;

export const CorrelationStudySchema = z.object({
  libraryVersionId: z.uuid(),
  productName: z.string(),
  version: z.number().int(),
  model: z.string(),
  parameters: z.array(z.object({ name: z.string(), unit: z.string() })),
  chemistry: z.array(z.object({ field: z.string(), label: z.string(), unit: z.string() })),
  cells: z.array(CorrelationCellSchema),
  /** One row per lot: fitted parameters and recorded chemistry (null when not recorded or not fitted). */
  lots: z.array(z.object({ lotCode: z.string(), parameters: z.record(z.string(), z.number().nullable()), chemistry: z.record(z.string(), z.number().nullable()) })),
  lotsNotFitted: z.array(z.string()),
});
export type CorrelationStudy = z.infer<typeof CorrelationStudySchema>;

export const HistogramSchema = z.object({ edges: z.array(z.number()), within: z.array(z.number().int()), between: z.array(z.number().int()) });

export const RepeatabilityStudySchema = z.object({
  libraryVersionId: z.uuid(),
  /** Distances between replicates of one sample, over every sample measured under the method. */
  within: z.object({ count: z.number().int(), samples: z.number().int(), median: z.number().nullable(), p95: z.number().nullable(), max: z.number().nullable() }),
  /** Distances between pairs of lots of the version. */
  between: z.object({ count: z.number().int(), median: z.number().nullable(), p5: z.number().nullable(), min: z.number().nullable() }),
  histogram: HistogramSchema,
  /** median(between) ÷ median(within); large means replicates agree far better than lots differ. */
  ratio: z.number().nullable(),
  /** True when some replicate distances come from the demo's synthesised trials. */
  synthesisedForDemo: z.boolean(),
});
export type RepeatabilityStudy = z.infer<typeof RepeatabilityStudySchema>;

export const MixtureSchema = z.object({
  admixture: z.enum(['water', 'other-product']),
  /** What was added, e.g. "tap water" or another product's name. */
  admixtureName: z.string().trim().min(1).max(120),
  /** Share of the admixture in the mixture, % by volume. */
  levelPercent: z.number().gt(0).max(100),
});
export type Mixture = z.infer<typeof MixtureSchema>;

export const ValidationFlagsSchema = z.object({
  /** An authentic reference lot sent blind as a routine check (ongoing performance). */
  blindCheck: z.boolean(),
  /** A deliberate mixture for the detection study, or null. */
  mixture: MixtureSchema.nullable(),
});
export type ValidationFlags = z.infer<typeof ValidationFlagsSchema>;

export const VerdictCountsSchema = z.object({
  notConsistent: z.number().int(),
  inconclusive: z.number().int(),
  consistent: z.number().int(),
  noVerdict: z.number().int(),
});

export const DetectionStudySchema = z.object({
  productId: z.uuid(),
  productName: z.string(),
  detectionRule: z.string(),
  series: z.array(
    z.object({
      admixture: z.enum(['water', 'other-product']),
      admixtureName: z.string(),
      levels: z.array(z.object({ levelPercent: z.number(), total: z.number().int(), counts: VerdictCountsSchema, notConsistentShare: z.number(), reliablyDetected: z.boolean() })),
      /** The lowest level from which every higher level is also reliably detected; null if none. */
      lowestReliableLevelPercent: z.number().nullable(),
    }),
  ),
  synthesisedForDemo: z.boolean(),
});
export type DetectionStudy = z.infer<typeof DetectionStudySchema>;

export const OngoingPerformanceSchema = z.object({
  total: z.number().int(),
  notConsistent: z.number().int(),
  observedRate: z.number().nullable(),
  /** The rate the decision rule promises at most: 1 − the upper quantile (1 % above T99). */
  promisedRate: z.number(),
  pValue: z.number().nullable(),
  test: z.string(),
  warning: z.string().nullable(),
  checks: z.array(z.object({ at: z.iso.datetime({ offset: true }), reference: z.string(), productName: z.string(), verdict: z.string(), synthesisedForDemo: z.boolean() })),
});
export type OngoingPerformance = z.infer<typeof OngoingPerformanceSchema>;
