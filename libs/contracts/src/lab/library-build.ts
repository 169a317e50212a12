import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { ChemistrySchema } from './chemistry';
import { MatrixSchema } from './products';

/** Start a draft version of a product's library from its measured reference-lot samples. */
export const CreateLibraryDraftSchema = z.object({ productId: z.uuid(), methodVersionId: z.uuid() });
export type CreateLibraryDraft = z.infer<typeof CreateLibraryDraftSchema>;

export const LibraryDraftCreatedSchema = z.object({
  id: z.uuid(),
  version: z.number().int(),
  lotCount: z.number().int(),
  /** Reference-lot samples that could not become lots, and why (no usable replicate, band not covered…). */
  skipped: z.array(z.object({ sampleCode: z.string(), reason: z.string() })),
});
export type LibraryDraftCreated = z.infer<typeof LibraryDraftCreatedSchema>;

/** A lot's measurement quality as the method judges it. */
export const LotQualitySchema = z.object({
  replicates: z.number().int(),
  /** Largest Kramers–Kronig residual over its replicates, % of |Z|; null when not recorded. */
  kkMaxResidualPercent: z.number().nullable(),
  /** Largest distance between two of its replicates; null with one replicate. */
  replicateMaxDistance: z.number().nullable(),
  /** Plain-words problems against the method's limits; empty when none. */
  problems: z.array(z.string()),
});
export type LotQuality = z.infer<typeof LotQualitySchema>;

export const LibraryLotSchema = z.object({
  id: z.uuid(),
  lotCode: z.string(),
  producedOn: z.iso.date().nullable(),
  sampleCode: z.string().nullable(),
  included: z.boolean(),
  exclusionReason: z.string().nullable(),
  quality: LotQualitySchema,
  chemistry: ChemistrySchema,
  /** Leave-one-out distance to the nearest other included lot (from the stored calibration). */
  looDistance: z.number().nullable(),
  nearestLotCode: z.string().nullable(),
  /** Share of the other lots' leave-one-out distances above this lot's: near 0 marks an outlier. */
  typicality: z.number().nullable(),
  /** Above T99 of its own library: the lot stands out. */
  outlier: z.boolean(),
});
export type LibraryLot = z.infer<typeof LibraryLotSchema>;

export const LibraryLotQuerySchema = listQuery(['lotCode', 'distance', 'producedOn']).extend({
  included: z.enum(['all', 'included', 'excluded']).default('all'),
});
export type LibraryLotQuery = z.infer<typeof LibraryLotQuerySchema>;
export const LibraryLotPageSchema = pageOf(LibraryLotSchema);
export type LibraryLotPage = z.infer<typeof LibraryLotPageSchema>;

export const LotInclusionSchema = z.object({
  included: z.boolean(),
  /** Why: kept in the audit log, and on the lot while it is excluded. */
  reason: z.string().trim().min(3, 'say why, in a few words').max(500),
});
export type LotInclusion = z.infer<typeof LotInclusionSchema>;

export const RetireLibraryVersionSchema = z.object({ reason: z.string().trim().min(3, 'say why, in a few words').max(500) });
export type RetireLibraryVersion = z.infer<typeof RetireLibraryVersionSchema>;

const Series = z.array(z.number());

/** What the library screen draws, small whatever the number of lots. */
export const LibraryOverviewSchema = z.object({
  impedanceUnit: z.string(),
  frequencyHz: Series,
  /** Range of the included lots at each grid frequency (min–max), and the median. */
  band: z
    .object({
      reLow: Series, reHigh: Series, imLow: Series, imHigh: Series,
      modulusLow: Series, modulusHigh: Series, phaseLowDeg: Series, phaseHighDeg: Series,
      reMedian: Series, imMedian: Series,
    })
    .nullable(),
  /** The lots farthest from the rest, drawn as lines over the band. */
  standouts: z.array(z.object({ lotCode: z.string(), re: Series, im: Series })),
  /** 2-D map (classical MDS) of the included lots; at most MAP_LIMIT points, the farthest kept. */
  map: z.array(z.object({ lotId: z.uuid(), lotCode: z.string(), x: z.number(), y: z.number() })),
  mapLotsLeftOut: z.number().int(),
});
export type LibraryOverview = z.infer<typeof LibraryOverviewSchema>;

/** How well the method tells a producer's products of one matrix apart. */
export const CrossProductCheckSchema = z.object({
  matrix: MatrixSchema,
  products: z.array(z.object({ id: z.uuid(), name: z.string(), libraryVersionId: z.uuid(), version: z.number().int(), status: z.string(), lotCount: z.number().int() })),
  /** confusion[i][j]: lots of products[i] whose nearest other lot belongs to products[j]. */
  confusion: z.array(z.array(z.number().int())),
  /** Share of lots whose nearest other lot is of their own product. */
  agreement: z.number().nullable(),
  /** Lots whose nearest other lot belongs to another product. */
  confused: z.array(z.object({ lotCode: z.string(), product: z.string(), nearestProduct: z.string(), nearestLotCode: z.string(), distance: z.number() })),
  /** Products of the same matrix that could not be compared, and why. */
  notCompared: z.array(z.object({ name: z.string(), reason: z.string() })),
});
export type CrossProductCheck = z.infer<typeof CrossProductCheckSchema>;

export const VersionLotParamsSchema = z.object({ id: z.uuid({ message: 'must be a UUID' }), lotId: z.uuid({ message: 'must be a UUID' }) });

/** A product of the lab as the library screen lists it: measured reference lots and its library's versions. */
export const LibraryProductSchema = z.object({
  productId: z.uuid(),
  name: z.string(),
  matrix: MatrixSchema,
  clientName: z.string(),
  /** Reference-lot samples past intake with at least one included replicate. */
  measuredLots: z.number().int(),
  versions: z.array(z.object({ id: z.uuid(), version: z.number().int(), status: z.string(), lotCount: z.number().int(), supersededBy: z.number().int().nullable() })),
});
export type LibraryProduct = z.infer<typeof LibraryProductSchema>;
export const LibraryProductPageSchema = pageOf(LibraryProductSchema);
export const LibraryProductQuerySchema = listQuery(['name', 'client']);
export type LibraryProductQuery = z.infer<typeof LibraryProductQuerySchema>;
