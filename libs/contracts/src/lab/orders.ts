import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { NamedRefSchema } from '../auth';
import { UserRefSchema } from './refs';
import { MatrixSchema, plainText } from './products';
import { ReferenceLotDeclarationSchema, SampleKindSchema } from './chemistry';
import { SampleStateSchema } from './sample-state';

/** `closed`: every sample was rejected at intake, so nothing was reported and every credit returned. */
export const ORDER_STATUSES = ['placed', 'in-progress', 'completed', 'closed', 'cancelled'] as const;
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

export const ORDER_KINDS = ['check', 'reference-enrolment'] as const;
export const OrderKindSchema = z.enum(ORDER_KINDS);
export type OrderKind = z.infer<typeof OrderKindSchema>;

/** Where a sample's credits stand: held for it, returned (cancelled, rejected) or spent on its report. */
export const SAMPLE_CREDIT_STATES = ['none', 'reserved', 'released', 'consumed'] as const;
export const SampleCreditStateSchema = z.enum(SAMPLE_CREDIT_STATES);
export type SampleCreditState = z.infer<typeof SampleCreditStateSchema>;

export const OrderSampleSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  state: SampleStateSchema,
  kind: SampleKindSchema,
  description: SampleDescriptionSchema,
  container: z.string(),
  notes: z.string(),
  referenceLot: ReferenceLotDeclarationSchema.nullable(),
  credits: z.number().int().min(0),
  creditState: SampleCreditStateSchema,
  hasPhoto: z.boolean(),
  receivedAt: z.iso.datetime({ offset: true }).nullable(),
  rejectionReason: z.string().nullable(),
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
  kind: OrderKindSchema,
  shipment: z.object({ carrier: z.string(), trackingNumber: z.string(), shippedAt: z.iso.datetime({ offset: true }) }).nullable(),
  cancelledAt: z.iso.datetime({ offset: true }).nullable(),
  samples: z.array(OrderSampleSchema),
});
export type OrderSummary = z.infer<typeof OrderSummarySchema>;

/** One suspect sample as the client describes it when ordering a check. */
export const NewCheckSampleSchema = z.strictObject({
  obtainedWhere: plainText(300).pipe(z.string().min(1, 'is required')),
  obtainedOn: z.iso.date().refine((d) => d <= new Date().toISOString().slice(0, 10), 'must not be in the future'),
  labelText: plainText(2000).default(''),
  lotClaimed: plainText(100).default(''),
  container: plainText(200).default(''),
  notes: plainText(2000).default(''),
});
export type NewCheckSample = z.infer<typeof NewCheckSampleSchema>;

export const MAX_SAMPLES_PER_ORDER = 50;

/** `POST /api/client/orders`: checks of one product with a published library. */
export const NewCheckOrderSchema = z.strictObject({
  productId: z.uuid({ message: 'must be a UUID' }),
  samples: z.array(NewCheckSampleSchema).min(1, 'add at least one sample').max(MAX_SAMPLES_PER_ORDER),
});
export type NewCheckOrder = z.infer<typeof NewCheckOrderSchema>;

/** One authentic lot declared for enrolment, with notes for the lab. */
export const NewReferenceLotSchema = z.strictObject({
  lotCode: plainText(60).pipe(z.string().min(1, 'is required')),
  producedOn: z.iso.date().refine((d) => d <= new Date().toISOString().slice(0, 10), 'must not be in the future'),
  volumeMl: z.number().finite().positive().max(100_000),
  chemistry: ReferenceLotDeclarationSchema.shape.chemistry,
  notes: plainText(2000).default(''),
});
export type NewReferenceLot = z.infer<typeof NewReferenceLotSchema>;

/** `POST /api/client/reference-orders`: authentic lots of one product to enrol in its library. */
export const NewReferenceOrderSchema = z.strictObject({
  productId: z.uuid({ message: 'must be a UUID' }),
  lots: z.array(NewReferenceLotSchema).min(1, 'add at least one lot').max(MAX_SAMPLES_PER_ORDER),
});
export type NewReferenceOrder = z.infer<typeof NewReferenceOrderSchema>;

/** `POST /api/client/orders/:id/shipment`: how the parcel travels to the lab. */
export const OrderShipmentSchema = z.strictObject({
  carrier: plainText(100).pipe(z.string().min(1, 'is required')),
  trackingNumber: plainText(100).default(''),
});
export type OrderShipment = z.infer<typeof OrderShipmentSchema>;

/** What an order will cost before it is placed, and what the organisation holds. */
export const OrderPricesSchema = z.object({
  creditsPerCheckSample: z.number().int(),
  creditsPerReferenceLot: z.number().int(),
  available: z.number().int(),
  reserved: z.number().int(),
});
export type OrderPrices = z.infer<typeof OrderPricesSchema>;

export const ClientOrderListQuerySchema = listQuery(['placedAt', 'status', 'product'], 'desc').extend({
  status: OrderStatusSchema.optional(),
  kind: OrderKindSchema.optional(),
});
export type ClientOrderListQuery = z.infer<typeof ClientOrderListQuerySchema>;
export const OrderPageSchema = pageOf(OrderSummarySchema);
export type OrderPage = z.infer<typeof OrderPageSchema>;
