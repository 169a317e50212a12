import { z } from 'zod';
import { NamedRefSchema } from '../auth';
import { UserRefSchema } from './refs';
import { DeclaredExportSchema, FileRefusalSchema, TemperatureSourceSchema, UploadConfirmationsFieldSchema } from './export-identity';
import { CellControlStatusSchema } from './validation';

/** Cell constant from the form, or from the cell's newest KCl calibration. */
export const CELL_CONSTANT_SOURCES = ['entered', 'latest-calibration'] as const;
export const CellConstantSourceSchema = z.enum(CELL_CONSTANT_SOURCES);
export type CellConstantSource = z.infer<typeof CellConstantSourceSchema>;

/**
 * Text fields of the multipart measurement upload (files go in the `files` field, one
 * instrument export per replicate). Multipart values are strings, hence the coercion.
 */
export const MeasurementUploadFieldsSchema = z
  .object({
    instrumentId: z.uuid(),
    cellId: z.uuid(),
    cellConstantSource: CellConstantSourceSchema.default('latest-calibration'),
    /** cm⁻¹; required when `cellConstantSource` is `entered`. */
    cellConstantPerCm: z.coerce.number().positive().max(1000).optional(),
    /**
     * Sample temperature during the sweep, °C. Needed for files that do not state one; a file's
     * own temperature is used otherwise, and a typed value that differs from it by more than the
     * method's limit needs a `temperature` confirmation.
     */
    temperatureC: z.preprocess((v) => (v === '' ? undefined : v), z.coerce.number().min(-10).max(90).optional()),
    /** JSON array of `{ fileName, about, reason }`: what the analyst confirms per file (audited). */
    confirmations: UploadConfirmationsFieldSchema.optional(),
  })
  .refine((v) => v.cellConstantSource !== 'entered' || v.cellConstantPerCm !== undefined, {
    path: ['cellConstantPerCm'],
    message: 'enter the cell constant (cm⁻¹) or choose the latest KCl calibration',
  });
export type MeasurementUploadFields = z.infer<typeof MeasurementUploadFieldsSchema>;

/** The Kramers–Kronig check of one replicate, as the engine computed it. */
export const KramersKronigSummarySchema = z.object({
  passed: z.boolean(),
  /** Largest |residual| over real and imaginary parts, % of |Z|. */
  maxResidualPercent: z.number(),
  /** Number of RC elements the μ criterion settled on. */
  elements: z.number().int(),
  mu: z.number(),
  limitPercent: z.number(),
});
export type KramersKronigSummary = z.infer<typeof KramersKronigSummarySchema>;

export const ReplicateSchema = z.object({
  id: z.uuid(),
  replicateNumber: z.number().int().min(1),
  fileName: z.string(),
  instrument: NamedRefSchema,
  cell: NamedRefSchema,
  cellConstantPerCm: z.number(),
  cellConstantSource: CellConstantSourceSchema,
  calibrationId: z.uuid().nullable(),
  temperatureC: z.number(),
  temperatureSource: TemperatureSourceSchema,
  /** What the export said about itself; null for uploads made before it was read. */
  declared: DeclaredExportSchema.nullable(),
  pointCount: z.number().int(),
  minFrequencyHz: z.number(),
  maxFrequencyHz: z.number(),
  kramersKronig: KramersKronigSummarySchema,
  excluded: z.boolean(),
  exclusionReason: z.string().nullable(),
  /** `instrument-key` when a bench computer posted it with an API key. */
  via: z.enum(['portal', 'instrument-key']),
  uploadedBy: UserRefSchema.nullable(),
  uploadedAt: z.iso.datetime({ offset: true }),
});
export type Replicate = z.infer<typeof ReplicateSchema>;

/** A file the upload could not read; the others in the same upload are still saved. */
export const RejectedFileSchema = z.object({
  fileName: z.string(),
  line: z.number().int().nullable(),
  column: z.number().int().nullable(),
  message: z.string(),
  /** Why it was refused; a confirmation with a reason keeps `other-sample` and `temperature-mismatch` files. */
  problem: FileRefusalSchema,
  /** The other sample's code the file names (`other-sample`). */
  namedCode: z.string().nullable(),
  /** The file's own temperature, °C, when it states one. */
  fileTemperatureC: z.number().nullable(),
});
export type RejectedFile = z.infer<typeof RejectedFileSchema>;

export const MeasurementUploadResultSchema = z.object({
  saved: z.array(ReplicateSchema),
  rejected: z.array(RejectedFileSchema),
});
export type MeasurementUploadResult = z.infer<typeof MeasurementUploadResultSchema>;

/** How well the included replicates agree (engine's `replicateAgreement`). */
export const ReplicateAgreementSummarySchema = z.object({
  replicateCount: z.number().int(),
  /** Largest pairwise spectrum distance among the included replicates. */
  maxPairDistance: z.number(),
  meanPairDistance: z.number(),
  limit: z.number(),
  passed: z.boolean(),
});
export type ReplicateAgreementSummary = z.infer<typeof ReplicateAgreementSummarySchema>;

export const SampleMeasurementsSchema = z.object({
  sampleId: z.uuid(),
  replicates: z.array(ReplicateSchema),
  /** Null with fewer than two included replicates. */
  agreement: ReplicateAgreementSummarySchema.nullable(),
});
export type SampleMeasurements = z.infer<typeof SampleMeasurementsSchema>;

export const ExcludeReplicateSchema = z.object({ reason: z.string().trim().min(5).max(1000) });
export type ExcludeReplicate = z.infer<typeof ExcludeReplicateSchema>;

/** Spectrum of one replicate for Bode and Nyquist plots (hertz, ohms, as measured). */
export const SpectrumPointsSchema = z.object({
  frequencyHz: z.array(z.number()),
  re: z.array(z.number()),
  im: z.array(z.number()),
});
export type SpectrumPoints = z.infer<typeof SpectrumPointsSchema>;

export const CellCalibrationSchema = z.object({
  id: z.uuid(),
  standardName: z.string(),
  /** Certified conductivity of the KCl standard at its temperature, µS/cm. */
  standardConductivityUsPerCm: z.number(),
  standardTemperatureC: z.number(),
  /** Real impedance on the plateau where the phase is about 0°, Ω. */
  plateauResistanceOhm: z.number(),
  /** K = κ · R, cm⁻¹. */
  cellConstantPerCm: z.number(),
  measuredAt: z.iso.datetime({ offset: true }),
  measuredBy: UserRefSchema,
});
export type CellCalibration = z.infer<typeof CellCalibrationSchema>;

export const RecordCellCalibrationSchema = z.object({
  standardName: z.string().trim().min(1).max(200),
  standardConductivityUsPerCm: z.number().positive().max(1e6),
  standardTemperatureC: z.number().min(0).max(50),
  plateauResistanceOhm: z.number().positive().max(1e9),
  measuredAt: z.iso.datetime({ offset: true }).optional(),
});
export type RecordCellCalibration = z.infer<typeof RecordCellCalibrationSchema>;

export const MeasurementCellSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  nominalConstantPerCm: z.number(),
  latestCalibration: CellCalibrationSchema.nullable(),
  /** Whether the cell's control chart lets it be used (an out-of-control cell refuses uploads). */
  control: CellControlStatusSchema.nullable().optional(),
});
export type MeasurementCell = z.infer<typeof MeasurementCellSchema>;

export const InstrumentSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  model: z.string(),
  serialNumber: z.string(),
});
export type Instrument = z.infer<typeof InstrumentSchema>;

/** What the upload form offers: the lab's instruments and cells. */
export const BenchEquipmentSchema = z.object({
  instruments: z.array(InstrumentSchema),
  cells: z.array(MeasurementCellSchema),
});
export type BenchEquipment = z.infer<typeof BenchEquipmentSchema>;
