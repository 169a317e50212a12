import { z } from 'zod';
import { listQuery, pageOf } from '../paging';
import { NamedRefSchema } from '../auth';
import { UserRefSchema } from './refs';
import { MatrixSchema } from './products';
import { SampleDescriptionSchema } from './orders';
import { SampleCodeSchema, SampleStateSchema } from './sample-state';
import { IntakeWarningSchema } from './intake-limits';

export const CONTAINER_CONDITIONS = ['intact', 'damaged', 'leaking', 'unlabelled'] as const;
export const ContainerConditionSchema = z.enum(CONTAINER_CONDITIONS);
export type ContainerCondition = z.infer<typeof ContainerConditionSchema>;
/** How each container condition reads on screen. */
export const CONTAINER_CONDITION_LABELS: Readonly<Record<ContainerCondition, string>> = {
  intact: 'Intact',
  damaged: 'Damaged',
  leaking: 'Leaking',
  unlabelled: 'No label',
};

export const SampleLookupParamsSchema = z.object({ code: SampleCodeSchema });

/** Arrival as the intake technician records it from the parcel in hand. */
export const RecordArrivalSchema = z.object({
  carrier: z.string().trim().min(1).max(100),
  trackingNumber: z.string().trim().max(100).default(''),
  arrivedAt: z.iso.datetime({ offset: true }),
  /** Temperature of the parcel contents on arrival, °C. */
  temperatureC: z.number().min(-40).max(80),
  sealIntact: z.boolean(),
  containerCondition: ContainerConditionSchema,
  volumeMl: z.number().positive().max(100000),
  notes: z.string().trim().max(2000).default(''),
});
export type RecordArrival = z.infer<typeof RecordArrivalSchema>;

export const AcceptSampleSchema = z.object({
  storageLocation: z.string().trim().min(1).max(200),
  /** Why the sample is accepted despite its intake warnings; required when there are any. */
  overrideReason: z.string().trim().min(5).max(2000).optional(),
});
export type AcceptSample = z.infer<typeof AcceptSampleSchema>;

export const RejectSampleSchema = z.object({ reason: z.string().trim().min(5).max(2000) });
export type RejectSample = z.infer<typeof RejectSampleSchema>;

export const IntakePhotoSchema = z.object({
  id: z.uuid(),
  fileName: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
  uploadedAt: z.iso.datetime({ offset: true }),
  uploadedBy: UserRefSchema,
});
export type IntakePhoto = z.infer<typeof IntakePhotoSchema>;

export const IntakeRecordSchema = RecordArrivalSchema.extend({
  recordedBy: UserRefSchema,
  recordedAt: z.iso.datetime({ offset: true }),
});
export type IntakeRecord = z.infer<typeof IntakeRecordSchema>;

/** Everything the lab sees about one sample: the order behind it, intake, where it is now. */
export const SampleDetailSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  state: SampleStateSchema,
  description: SampleDescriptionSchema,
  order: z.object({
    id: z.uuid(),
    placedAt: z.iso.datetime({ offset: true }),
    placedBy: UserRefSchema,
    creditsReserved: z.number().int(),
  }),
  product: z.object({ id: z.uuid(), name: z.string(), matrix: MatrixSchema }),
  clientOrganisation: NamedRefSchema,
  intake: IntakeRecordSchema.nullable(),
  /** What intake should look at twice before accepting (empty before arrival or when all is well). */
  intakeWarnings: z.array(IntakeWarningSchema),
  photos: z.array(IntakePhotoSchema),
  rejectionReason: z.string().nullable(),
  storageLocation: z.string().nullable(),
  ageDays: z.number(),
  turnaroundDays: z.number().int(),
  dueAt: z.iso.datetime({ offset: true }),
});
export type SampleDetail = z.infer<typeof SampleDetailSchema>;

/** One row of the lab's work queue; age counts from arrival, or from ordering before it. */
export const WorkQueueItemSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  state: SampleStateSchema,
  productName: z.string(),
  matrix: MatrixSchema,
  clientOrganisationName: z.string(),
  placedAt: z.iso.datetime({ offset: true }),
  receivedAt: z.iso.datetime({ offset: true }).nullable(),
  ageDays: z.number(),
  turnaroundDays: z.number().int(),
  dueAt: z.iso.datetime({ offset: true }),
  overdue: z.boolean(),
});
export type WorkQueueItem = z.infer<typeof WorkQueueItemSchema>;

/** Default order: oldest first. `state` may repeat (`?state=accepted&state=measuring`) or be comma-separated. */
export const WorkQueueQuerySchema = listQuery(['age', 'due', 'code', 'state', 'product', 'client'], 'desc')
  .extend({
    state: z
      .union([z.string(), z.array(z.string())])
      .optional()
      .transform((v) => (v === undefined ? [] : (Array.isArray(v) ? v : v.split(',')).filter((s) => s !== '')))
      .pipe(z.array(SampleStateSchema)),
  });
export type WorkQueueQuery = z.infer<typeof WorkQueueQuerySchema>;
export const WorkQueuePageSchema = pageOf(WorkQueueItemSchema);
export type WorkQueuePage = z.infer<typeof WorkQueuePageSchema>;
