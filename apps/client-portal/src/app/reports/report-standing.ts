import type { ReportSummary } from '@ohmprint/contracts';

/**
 * Whether a report still stands, in words: a revoked report's result is withdrawn, a superseded
 * one is replaced by a newer revision. Null for a report that stands.
 */
export function reportStanding(r: ReportSummary): { icon: string; label: string } | null {
  if (r.status === 'revoked') return { icon: 'block', label: 'Revoked by the lab — result withdrawn' };
  if (r.status === 'superseded') return { icon: 'history', label: r.supersededByNumber ? `Superseded by ${r.supersededByNumber}` : 'Superseded by a newer revision' };
  return null;
}
