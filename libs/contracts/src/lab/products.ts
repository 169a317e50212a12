import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { NamedRefSchema } from '../auth';

export const MATRICES = ['wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine', 'other-liquid'] as const;
export const MatrixSchema = z.enum(MATRICES);
export type Matrix = z.infer<typeof MatrixSchema>;

/** How each matrix reads on screens and labels. */
export const MATRIX_LABELS: Readonly<Record<Matrix, string>> = {
  wine: 'Wine',
  milk: 'Milk',
  juice: 'Fruit juice',
  vinegar: 'Vinegar',
  spirit: 'Spirit',
  brine: 'Brine',
  'other-liquid': 'Other liquid',
};

/** Text a person types: no control characters (NUL and friends) except line breaks and tabs. */
export const plainText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .refine((v) => ![...v].some(isControl), 'must not contain control characters');

function isControl(c: string): boolean {
  const code = c.charCodeAt(0);
  return (code < 32 && c !== '\t' && c !== '\n' && c !== '\r') || code === 127;
}

/** A product as its client admin registers or edits it (the label photo goes separately). */
export const ProductInputSchema = z.strictObject({
  name: plainText(120).pipe(z.string().min(1, 'is required')),
  matrix: MatrixSchema,
  description: plainText(2000).default(''),
});
export type ProductInput = z.infer<typeof ProductInputSchema>;

/**
 * Where the product's reference library stands: none yet (no library or nothing enrolled), being
 * built (lots enrolled or a draft version, nothing published), or published (a version checks use).
 */
export const LIBRARY_STATES = ['none', 'building', 'published'] as const;
export const LibraryStateSchema = z.enum(LIBRARY_STATES);
export type LibraryState = z.infer<typeof LibraryStateSchema>;

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
  libraryState: LibraryStateSchema,
  /** Whether a label photo is stored (`GET /api/client/products/:id/photo`). */
  hasPhoto: z.boolean(),
});
export type ProductSummary = z.infer<typeof ProductSummarySchema>;

export const ProductListQuerySchema = listQuery(['name', 'matrix']);
export type ProductListQuery = z.infer<typeof ProductListQuerySchema>;
export const ProductPageSchema = pageOf(ProductSummarySchema);
export type ProductPage = z.infer<typeof ProductPageSchema>;
