import type { VerificationResult } from '@ohmprint/contracts';

type Outcome = VerificationResult['outcome'];

/** Icon, heading and tone for each outcome; words first, colour only repeats them. */
export const OUTCOME_LOOK: Readonly<Record<Outcome, { readonly icon: string; readonly heading: string; readonly tone: 'good' | 'warn' | 'bad' }>> = {
  valid: { icon: 'verified', heading: 'Valid report', tone: 'good' },
  superseded: { icon: 'history', heading: 'Superseded: a newer revision replaces this report', tone: 'warn' },
  revoked: { icon: 'block', heading: 'Revoked by the issuing lab', tone: 'bad' },
  'not-found': { icon: 'search_off', heading: 'No report with this number and code', tone: 'bad' },
  'no-match': { icon: 'gpp_bad', heading: 'This file is not an issued report', tone: 'bad' },
};

type Look = (typeof OUTCOME_LOOK)[Outcome];

/**
 * A file that differs from the issued PDF must never read as "valid", even when the number and
 * code it was checked with are those of a report in force.
 */
const ALTERED_COPY: Look = { icon: 'gpp_bad', heading: 'This copy is not the PDF the lab issued', tone: 'bad' };

export function outcomeLook(result: VerificationResult): Look {
  return result.outcome === 'valid' && result.file && !result.file.identical ? ALTERED_COPY : OUTCOME_LOOK[result.outcome];
}

/** What the byte comparison says, when a file was uploaded. */
export function fileVerdict(result: VerificationResult): string | null {
  if (!result.file) return null;
  const hash = `SHA-256 ${result.file.sha256.slice(0, 16)}…`;
  return result.file.identical
    ? `The uploaded file is byte-identical to the PDF the lab issued (${hash}).`
    : `The uploaded file differs from every PDF the lab issued (${hash})${result.file.claimedNumber ? `; it claims to be ${result.file.claimedNumber}` : ''}. It may have been altered.`;
}
