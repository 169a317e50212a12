import { z } from 'zod';

/** Approving records the decision and queues the report's issuance (numbered, rendered, signed by a worker). */
export const ApproveAnalysisSchema = z.object({ comments: z.string().trim().max(5000).default('') });
export type ApproveAnalysis = z.infer<typeof ApproveAnalysisSchema>;

/** Returning sends the sample back to the analyst; say what to change. */
export const ReturnAnalysisSchema = z.object({ comments: z.string().trim().min(5).max(5000) });
export type ReturnAnalysis = z.infer<typeof ReturnAnalysisSchema>;

/**
 * Where an approved analysis's report is: `issuing` (queued or being rendered and signed),
 * `issued` (with its number), or `failed` (every attempt failed; `detail` says why).
 */
export const ReportIssuanceStateSchema = z.enum(['issuing', 'issued', 'failed']);
export type ReportIssuanceState = z.infer<typeof ReportIssuanceStateSchema>;

export const ApprovalResultSchema = z.object({
  analysisId: z.uuid(),
  state: ReportIssuanceStateSchema,
  report: z.object({ id: z.uuid(), number: z.string() }).nullable(),
  detail: z.string().nullable(),
});
export type ApprovalResult = z.infer<typeof ApprovalResultSchema>;
