import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { UserRefSchema } from './refs';
import { MatrixSchema } from './products';

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
  })
  .refine((m) => m.bandMaxHz > m.bandMinHz, { path: ['bandMaxHz'], message: 'must be above bandMinHz' })
  .refine((m) => m.upperQuantile > m.lowerQuantile, {
    path: ['upperQuantile'],
    message: 'must be above lowerQuantile',
  });
export type MethodSettings = z.infer<typeof MethodSettingsSchema>;

export const CalibrationSchema = z.object({
  t95: z.number(),
  t99: z.number(),
  lotCount: z.number().int(),
  /** Each lot's leave-one-out distance to its nearest other lot, ascending. */
  distances: z.array(z.number()),
});
export type Calibration = z.infer<typeof CalibrationSchema>;

export const LIBRARY_VERSION_STATUSES = ['draft', 'published'] as const;
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
});
export type ReferenceLot = z.infer<typeof ReferenceLotSchema>;

export const LibraryVersionDetailSchema = LibraryVersionSummarySchema.extend({
  libraryId: z.uuid(),
  product: z.object({ id: z.uuid(), name: z.string(), matrix: MatrixSchema }),
  method: MethodSettingsSchema,
  calibration: CalibrationSchema.nullable(),
  lots: z.array(ReferenceLotSchema),
});
export type LibraryVersionDetail = z.infer<typeof LibraryVersionDetailSchema>;
