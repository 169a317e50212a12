import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { NamedRefSchema } from '../auth';
import { UserRefSchema } from './refs';
import { MatrixSchema } from './products';
import { SampleStateSchema } from './sample-state';

export const ORDER_STATUSES = ['placed', 'in-progress', 'completed', 'cancelled'] as const;
export const OrderStatusSchema = z.enum(ORDER_STATUSES);
export type OrderStatus = z.infer<typeof OrderStatusSchema>;

/** What the client told us about a suspect sample when ordering. */
export const SampleDescriptionSchema = z.object({
  obtainedWhere: z.string().trim().min(1).max(300),
  /** ISO date (YYYY-MM-DD). */
  obtainedOn: z.iso.date(),
  labelText: z.string().trim().max(2000),
  claimedLot: z.string().trim().max(100),
});
export type SampleDescription = z.infer<typeof SampleDescriptionSchema>;

export const OrderSampleSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  state: SampleStateSchema,
  description: SampleDescriptionSchema,
  updatedAt: z.iso.datetime({ offset: true }),
});
export type OrderSample = z.infer<typeof OrderSampleSchema>;

export const OrderSummarySchema = z.object({
  id: z.uuid(),
  product: z.object({ id: z.uuid(), name: z.string(), matrix: MatrixSchema }),
  clientOrganisation: NamedRefSchema,
  status: OrderStatusSchema,
  placedBy: UserRefSchema,
  placedAt: z.iso.datetime({ offset: true }),
  creditsReserved: z.number().int().min(0),
  samples: z.array(OrderSampleSchema),
});
export type OrderSummary = z.infer<typeof OrderSummarySchema>;

export const ClientOrderListQuerySchema = listQuery(['placedAt', 'status', 'product'], 'desc').extend({
  status: OrderStatusSchema.optional(),
});
export type ClientOrderListQuery = z.infer<typeof ClientOrderListQuerySchema>;
export const OrderPageSchema = pageOf(OrderSummarySchema);
export type OrderPage = z.infer<typeof OrderPageSchema>;
