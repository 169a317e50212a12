import type { AnalysisStatus } from '@ohmprint/contracts';

const LABELS: Record<AnalysisStatus, string> = {
  draft: 'draft, not yet submitted',
  submitted: 'awaiting review',
  approved: 'approved, report issued',
  returned: 'returned to the analyst',
  superseded: 'superseded by a later analysis',
};

/** An analysis's status as lab staff say it, for "status …" lines. */
export function analysisStatusLabel(status: AnalysisStatus): string {
  return LABELS[status];
}
