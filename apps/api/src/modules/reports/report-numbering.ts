import type { EntityManager } from 'typeorm';
import { reportNumberConnection } from './report-number-connections';

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

export interface ReportNumberClaim {
  labId: string;
  year: number;
  value: number;
  number: string;
}

/**
 * A connection of its own (not from the pool the caller's transaction holds one of; see
 * `reportNumberConnection`), so the claim commits at once and a burst of issuances can never wait
 * on the pool it is holding.
 */
async function withOwnConnection<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
  const client = await reportNumberConnection();
  const manager = { query: async (sql: string, params?: unknown[]) => (await client.query(sql, params)).rows } as unknown as EntityManager;
  let broken: Error | undefined;
  try {
    await client.query('BEGIN');
    const result = await work(manager);
    await client.query('COMMIT');
    return result;
  } catch (err) {
    await client.query('ROLLBACK').catch((e: Error) => (broken = e));
    throw err;
  } finally {
    // a connection that could not even roll back is closed rather than handed to the next claim
    client.release(broken);
  }
}

/**
 * Takes the lab's next report number and holds it for the caller's issuing transaction.
 *
 * The number must be printed in the signed PDF, so it is known before rendering; but the lab's
 * counter row must not stay locked while a report renders and signs (every other approval of the
 * lab would queue behind it). So the number is claimed in a short transaction of its own, naming
 * the database session of the caller's transaction as its holder: first the lowest `held` claim
 * whose holder's transaction is over (it rolled back, or its process died), else the counter
 * moves on by one. The caller's transaction then locks the claim (FOR UPDATE) for as long as it
 * lives and marks it `issued` with the report row (`markClaimIssued`), both committing together.
 * A claim still locked, or whose holder's transaction is still the one that claimed it, is never
 * handed on. Numbers are unique (the claim's key and the report's unique number) and without
 * gaps (an abandoned number is the next one issued), though after a failure a number may be
 * issued a little after larger ones.
 */
export async function claimReportNumber(manager: EntityManager, lab: { id: string; name: string }, issuedAt: Date): Promise<ReportNumberClaim> {
  const year = issuedAt.getUTCFullYear();
  const [{ pid: holder }]: Array<{ pid: number }> = await manager.query('SELECT pg_backend_pid() AS pid');
  const { prefix, value } = await withOwnConnection(async (own) => {
    const prefix = await reportPrefix(own, lab.id, lab.name);
    // Abandoned: unlocked (SKIP LOCKED) and its holder session gone, idle, or in a later transaction.
    const abandoned: Array<{ value: number }> = await own.query(
      `SELECT c.value FROM report_number_claim c
        WHERE c.lab_id = $1 AND c.year = $2 AND c.state = 'held'
          AND NOT EXISTS (SELECT 1 FROM pg_stat_activity a WHERE a.pid = c.holder_pid AND a.xact_start <= c.held_at)
        ORDER BY c.value LIMIT 1 FOR UPDATE SKIP LOCKED`,
      [lab.id, year],
    );
    // The row is locked now, so nobody can change it; but the holder test above may have read
    // session activity cached before the row's last takeover committed (PostgreSQL re-checks a
    // row updated under it with the statistics snapshot it already took). Look again, fresh,
    // and leave a claim whose holder is still at work to that holder.
    if (abandoned.length) {
      await own.query('SELECT pg_stat_clear_snapshot()');
      const stillAbandoned: unknown[] = await own.query(
        `SELECT 1 FROM report_number_claim c
          WHERE c.lab_id = $1 AND c.year = $2 AND c.value = $3 AND c.state = 'held'
            AND NOT EXISTS (SELECT 1 FROM pg_stat_activity a WHERE a.pid = c.holder_pid AND a.xact_start <= c.held_at)`,
        [lab.id, year, abandoned[0].value],
      );
      if (!stillAbandoned.length) abandoned.length = 0;
    }
    if (abandoned.length) {
      await own.query(`UPDATE report_number_claim SET held_at = now(), holder_pid = $4 WHERE lab_id = $1 AND year = $2 AND value = $3`, [lab.id, year, abandoned[0].value, holder]);
      return { prefix, value: abandoned[0].value };
    }
    const rows: Array<{ last_value: number }> = await own.query(
      `INSERT INTO report_number_sequence (lab_id, year, last_value) VALUES ($1, $2, 1)
       ON CONFLICT (lab_id, year) DO UPDATE SET last_value = report_number_sequence.last_value + 1
       RETURNING last_value`,
      [lab.id, year],
    );
    await own.query(`INSERT INTO report_number_claim (lab_id, year, value, state, holder_pid) VALUES ($1, $2, $3, 'held', $4)`, [lab.id, year, rows[0].last_value, holder]);
    return { prefix, value: rows[0].last_value };
  });
  const locked: unknown[] = await manager.query(`SELECT 1 FROM report_number_claim WHERE lab_id = $1 AND year = $2 AND value = $3 AND state = 'held' AND holder_pid = $4 FOR UPDATE`, [lab.id, year, value, holder]);
  if (!locked.length) throw new Error(`Report number claim ${lab.id}/${year}/${value} was taken over before it could be locked.`);
  return { labId: lab.id, year, value, number: `${prefix}-${year}-${String(value).padStart(6, '0')}` };
}

/** Marks the claim issued in the caller's transaction, with the report row that carries it. */
export async function markClaimIssued(manager: EntityManager, claim: ReportNumberClaim, reportId: string): Promise<void> {
  await manager.query(`UPDATE report_number_claim SET state = 'issued', report_id = $4 WHERE lab_id = $1 AND year = $2 AND value = $3 AND state = 'held'`, [claim.labId, claim.year, claim.value, reportId]);
}
