import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { NamedRefSchema } from '../auth';

export const MATRICES = ['wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine'] as const;
export const MatrixSchema = z.enum(MATRICES);
export type Matrix = z.infer<typeof MatrixSchema>;

/** A producer's product; it belongs to one client organisation. */
export const ProductSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  matrix: MatrixSchema,
  description: z.string(),
  clientOrganisation: NamedRefSchema,
  /** The newest published library version, or null while none is published. */
  publishedLibraryVersion: z
    .object({ id: z.uuid(), version: z.number().int(), lotCount: z.number().int() })
    .nullable(),
});
export type ProductSummary = z.infer<typeof ProductSummarySchema>;

export const ProductListQuerySchema = listQuery(['name', 'matrix']);
export type ProductListQuery = z.infer<typeof ProductListQuerySchema>;
export const ProductPageSchema = pageOf(ProductSummarySchema);
export type ProductPage = z.infer<typeof ProductPageSchema>;
