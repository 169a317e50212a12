import { z } from 'zod';

/**
 * Where an analysis against a large library is. The worker scores the sample against the version's
 * lots: `queued`, `running`, `done` (with the new analysis's id) or `failed` (`detail` says why;
 * running the analysis again queues a new try). `idle` when none was asked for.
 */
export const AnalysisRunStateSchema = z.enum(['idle', 'queued', 'running', 'done', 'failed']);
export type AnalysisRunState = z.infer<typeof AnalysisRunStateSchema>;

export const AnalysisRunSchema = z.object({
  sampleId: z.uuid(),
  libraryVersionId: z.uuid().nullable(),
  state: AnalysisRunStateSchema,
  /** Included lots of the library version the sample is scored against. */
  lotCount: z.number().int(),
  analysisId: z.uuid().nullable(),
  detail: z.string().nullable(),
});
export type AnalysisRun = z.infer<typeof AnalysisRunSchema>;
