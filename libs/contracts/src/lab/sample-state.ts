import { z } from 'zod';

/**
 * Life of a sample in the lab. `returned-for-rework` is set when a reviewer sends an analysis
 * back; the analyst then re-analyses it (back to `analysed`) or re-measures it (`measuring`).
 * A `reported` sample goes back to work the same way once its report is revoked (the API checks
 * the revocation; the next report names the revoked one).
 */
export const SAMPLE_STATES = [
  'awaiting-arrival',
  'received',
  'accepted',
  'rejected',
  'measuring',
  'analysed',
  'in-review',
  'returned-for-rework',
  'reported',
] as const;
export const SampleStateSchema = z.enum(SAMPLE_STATES);
export type SampleState = z.infer<typeof SampleStateSchema>;

/** How each state reads to people, on screens (with an icon) and in the API's messages. */
export const SAMPLE_STATE_LABELS: Readonly<Record<SampleState, string>> = {
  'awaiting-arrival': 'Awaiting arrival',
  received: 'Received',
  accepted: 'Accepted',
  rejected: 'Rejected at intake',
  measuring: 'Being measured',
  analysed: 'Analysed',
  'in-review': 'In review',
  'returned-for-rework': 'Returned for rework',
  reported: 'Reported',
};

/** A state inside a sentence: "in review". */
export function sampleStateInWords(state: SampleState): string {
  return SAMPLE_STATE_LABELS[state].toLowerCase();
}

/** Which state may follow which; the API refuses any other move with a 409 problem. */
export const SAMPLE_TRANSITIONS: Readonly<Record<SampleState, readonly SampleState[]>> = {
  'awaiting-arrival': ['received'],
  received: ['accepted', 'rejected'],
  accepted: ['measuring'],
  rejected: [],
  measuring: ['measuring', 'analysed'],
  analysed: ['measuring', 'analysed', 'in-review'],
  'in-review': ['reported', 'returned-for-rework'],
  'returned-for-rework': ['measuring', 'analysed'],
  reported: ['measuring', 'analysed'],
};

export function canMoveSample(from: SampleState, to: SampleState): boolean {
  return SAMPLE_TRANSITIONS[from].includes(to);
}

/** Human-readable sample code such as `OP-7K3M-Q9`: Crockford base-32 letters (no I, L, O, U). */
export const SAMPLE_CODE_PATTERN = /^OP-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{2}$/;

/** A scanned or typed code: surrounding blanks dropped, case ignored. */
export const SampleCodeSchema = z
  .string()
  .trim()
  .transform((s) => s.toUpperCase())
  .pipe(z.string().regex(SAMPLE_CODE_PATTERN, 'a sample code looks like OP-7K3M-Q9'));
