import { z } from 'zod';

/**
 * Where the publication of a library version is. A version with many lots is published by a worker:
 * `draft` (not sent for publication), `queued`, then `running` (its calibration of `lotCount` lots), then `published`, or `failed`
 * (`detail` says why; pressing publish again queues it anew).
 */
export const LibraryPublicationStateSchema = z.enum(['draft', 'queued', 'running', 'published', 'failed']);
export type LibraryPublicationState = z.infer<typeof LibraryPublicationStateSchema>;

/** What a running publication is doing: comparing lots (leave-one-out), estimating the thresholds, or storing the version. */
export const LibraryPublicationStageSchema = z.enum(['comparing-lots', 'estimating-thresholds', 'storing']);
export type LibraryPublicationStage = z.infer<typeof LibraryPublicationStageSchema>;

/** How far a running publication is, as the worker last wrote it. */
export const LibraryPublicationProgressSchema = z.object({
  stage: LibraryPublicationStageSchema,
  /** Lots compared with every other lot so far, of `lotCount`. */
  lotsDone: z.number().int(),
  lotCount: z.number().int(),
  updatedAt: z.iso.datetime(),
});
export type LibraryPublicationProgress = z.infer<typeof LibraryPublicationProgressSchema>;

export const LibraryPublicationSchema = z.object({
  versionId: z.uuid(),
  version: z.number().int(),
  state: LibraryPublicationStateSchema,
  /** Included lots the calibration compares. */
  lotCount: z.number().int(),
  detail: z.string().nullable(),
  /** Only while `running`, once the worker has said how far it is. */
  progress: LibraryPublicationProgressSchema.optional(),
});
export type LibraryPublication = z.infer<typeof LibraryPublicationSchema>;

/**
 * What the library screen says while a version is being published, and how full its bar is
 * (`percent` null: the bar moves without a figure, for the stages that cannot count).
 */
export function publicationProgressText(p: Pick<LibraryPublication, 'state' | 'lotCount' | 'progress'>): { headline: string; percent: number | null } {
  const n = (x: number) => x.toLocaleString('en-GB');
  if (p.state === 'queued') return { headline: 'Waiting to publish…', percent: null };
  const progress = p.state === 'running' ? p.progress : undefined;
  if (!progress) return { headline: `Calibrating ${n(p.lotCount)} lots…`, percent: null };
  switch (progress.stage) {
    case 'comparing-lots': {
      const percent = progress.lotCount ? Math.min(100, Math.floor((100 * progress.lotsDone) / progress.lotCount)) : 0;
      return { headline: `Comparing lots: ${n(progress.lotsDone)} of ${n(progress.lotCount)} (${percent} %)…`, percent };
    }
    case 'estimating-thresholds':
      return { headline: `All ${n(progress.lotCount)} lots compared; setting the thresholds…`, percent: null };
    case 'storing':
      return { headline: 'Thresholds set; storing the version and its reference band…', percent: null };
  }
}
