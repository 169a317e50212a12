import { z } from 'zod';

/** Approving issues the report in the same transaction. */
export const ApproveAnalysisSchema = z.object({ comments: z.string().trim().max(5000).default('') });
export type ApproveAnalysis = z.infer<typeof ApproveAnalysisSchema>;

/** Returning sends the sample back to the analyst; say what to change. */
export const ReturnAnalysisSchema = z.object({ comments: z.string().trim().min(5).max(5000) });
export type ReturnAnalysis = z.infer<typeof ReturnAnalysisSchema>;

export const ApprovalResultSchema = z.object({
  analysisId: z.uuid(),
  report: z.object({ id: z.uuid(), number: z.string() }),
});
export type ApprovalResult = z.infer<typeof ApprovalResultSchema>;
