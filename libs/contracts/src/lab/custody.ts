import { z } from 'zod';
import { UserRefSchema } from './refs';

/**
 * Kinds of chain-of-custody event. `received`, `accepted`, `rejected` and `stored` are written by
 * the intake routes themselves; staff add the movement kinds by hand.
 */
export const CUSTODY_EVENT_KINDS = [
  'received',
  'accepted',
  'rejected',
  'stored',
  'moved',
  'taken-for-measurement',
  'returned-to-storage',
  'sent-out',
  'disposed',
] as const;
export const CustodyEventKindSchema = z.enum(CUSTODY_EVENT_KINDS);
export type CustodyEventKind = z.infer<typeof CustodyEventKindSchema>;

export const MANUAL_CUSTODY_KINDS = [
  'moved',
  'taken-for-measurement',
  'returned-to-storage',
  'sent-out',
  'disposed',
] as const;

/** Append a custody event (there is no way to change or remove one). */
export const RecordCustodyEventSchema = z.object({
  kind: z.enum(MANUAL_CUSTODY_KINDS),
  location: z.string().trim().min(1).max(200),
  reason: z.string().trim().min(1).max(1000),
  /** When it happened, if not now (ISO date-time); never in the future. */
  occurredAt: z.iso.datetime({ offset: true }).optional(),
});
export type RecordCustodyEvent = z.infer<typeof RecordCustodyEventSchema>;

export const CustodyEventSchema = z.object({
  id: z.uuid(),
  kind: CustodyEventKindSchema,
  location: z.string(),
  reason: z.string(),
  actor: UserRefSchema,
  occurredAt: z.iso.datetime({ offset: true }),
  recordedAt: z.iso.datetime({ offset: true }),
});
export type CustodyEvent = z.infer<typeof CustodyEventSchema>;

/** Timeline, oldest first. */
export const CustodyTimelineSchema = z.object({ sampleId: z.uuid(), events: z.array(CustodyEventSchema) });
export type CustodyTimeline = z.infer<typeof CustodyTimelineSchema>;
