import type { RejectedFile } from '@ohmprint/contracts';

/** "rep3.csv, line 14, column 2: expected a number" — where to look first, then what is wrong. */
export function rejectionText(r: Pick<RejectedFile, 'fileName' | 'line' | 'column' | 'message'>): string {
  const where = [r.fileName, r.line !== null ? `line ${r.line}` : null, r.column !== null ? `column ${r.column}` : null].filter(Boolean);
  return `${where.join(', ')}: ${r.message}`;
}
