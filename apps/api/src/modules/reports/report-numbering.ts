import type { EntityManager } from 'typeorm';

/** A lab's report prefix: up to three letters of its name, e.g. "Calder Analytical" → CAL. */
export function prefixCandidate(labName: string): string {
  const letters = labName
    .normalize('NFD')
    .replace(/[^A-Za-z]/g, '')
    .toUpperCase();
  return (letters + 'XX').slice(0, Math.max(2, Math.min(3, letters.length)));
}

/**
 * The lab's prefix, allocated on first use and then fixed (renaming the lab does not renumber its
 * reports). Prefixes are unique across labs, so a digit is appended when the letters are taken.
 */
export async function reportPrefix(manager: EntityManager, labId: string, labName: string): Promise<string> {
  const base = prefixCandidate(labName);
  for (let attempt = 0; attempt < 1000; attempt++) {
    const existing: Array<{ prefix: string }> = await manager.query('SELECT prefix FROM report_numbering WHERE lab_id = $1', [labId]);
    if (existing.length) return existing[0].prefix;
    const candidate = attempt === 0 ? base : `${base}${attempt + 1}`;
    await manager.query('INSERT INTO report_numbering (lab_id, prefix) VALUES ($1, $2) ON CONFLICT DO NOTHING', [labId, candidate]);
  }
  throw new Error(`No free report prefix for lab ${labId} starting ${base}.`);
}

/**
 * The next report number for the lab in the year of issue, like CAL-2026-000123. The counter row
 * stays locked until the issuing transaction ends, so a rolled-back issuance leaves no gap and
 * concurrent issuances queue instead of colliding.
 */
export async function nextReportNumber(manager: EntityManager, lab: { id: string; name: string }, issuedAt: Date): Promise<string> {
  const prefix = await reportPrefix(manager, lab.id, lab.name);
  const year = issuedAt.getUTCFullYear();
  const rows: Array<{ last_value: number }> = await manager.query(
    `INSERT INTO report_number_sequence (lab_id, year, last_value) VALUES ($1, $2, 1)
     ON CONFLICT (lab_id, year) DO UPDATE SET last_value = report_number_sequence.last_value + 1
     RETURNING last_value`,
    [lab.id, year],
  );
  return `${prefix}-${year}-${String(rows[0].last_value).padStart(6, '0')}`;
}

/** The number of revision `revision` of a report first issued as `baseNumber`. */
export function revisionNumber(baseNumber: string, revision: number): string {
  return revision === 0 ? baseNumber : `${baseNumber}-R${revision}`;
}
