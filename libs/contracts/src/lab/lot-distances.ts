import { z } from 'zod';
import { LotDistanceSchema } from './analyses';

export const MAX_LOT_DISTANCE_PAGE = 200;

/** `?after=&limit=`: ranks are 1-based positions in ascending distance; `after` is the last rank already read. */
export const LotDistancePageQuerySchema = z.object({
  after: z.coerce.number().int().min(0).max(10_000_000).default(0),
  limit: z.coerce.number().int().min(1).max(MAX_LOT_DISTANCE_PAGE).default(50),
});
export type LotDistancePageQuery = z.infer<typeof LotDistancePageQuerySchema>;

export const RankedLotDistanceSchema = LotDistanceSchema.extend({ rank: z.number().int().min(1) });
export type RankedLotDistance = z.infer<typeof RankedLotDistanceSchema>;

/** One page of every lot's distance to the sample, nearest first (ties by lot code); `next` is the `after` of the following page. */
export const LotDistancePageSchema = z.object({
  items: z.array(RankedLotDistanceSchema),
  total: z.number().int().min(0),
  next: z.number().int().min(1).nullable(),
});
export type LotDistancePage = z.infer<typeof LotDistancePageSchema>;
