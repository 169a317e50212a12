import { z } from 'zod';

/**
 * Where the publication of a library version is. A version with many lots is published by a worker:
 * `draft` (not sent for publication), `queued`, then `running` (its calibration of `lotCount` lots), then `published`, or `failed`
 * (`detail` says why; pressing publish again queues it anew).
 */
export const LibraryPublicationStateSchema = z.enum(['draft', 'queued', 'running', 'published', 'failed']);
export type LibraryPublicationState = z.infer<typeof LibraryPublicationStateSchema>;

export const LibraryPublicationSchema = z.object({
  versionId: z.uuid(),
  version: z.number().int(),
  state: LibraryPublicationStateSchema,
  /** Included lots the calibration compares. */
  lotCount: z.number().int(),
  detail: z.string().nullable(),
});
export type LibraryPublication = z.infer<typeof LibraryPublicationSchema>;
