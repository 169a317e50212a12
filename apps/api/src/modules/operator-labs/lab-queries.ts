import type { EntityManager } from 'typeorm';
import type { LabSummary, ListQuery, Page } from '@ohmprint/contracts';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

const SORT_COLUMNS: Record<string, string> = { name: 'lower(l.name)', createdAt: 'l.created_at', status: 'l.status' };

interface LabRow {
  id: string;
  name: string;
  legal_name: string;
  address: string;
  accreditation_body: string | null;
  accreditation_number: string | null;
  turnaround_target_days: number;
  status: LabSummary['status'];
  created_at: Date;
  staff_count: string;
}

/** Only the tenant's profile and head count: the operator never reads a lab's sample data. */
const SELECT = `
  SELECT l.id, l.name, l.legal_name, l.address, l.accreditation_body, l.accreditation_number,
         l.turnaround_target_days, l.status, l.created_at,
         (SELECT count(DISTINCT r.user_id) FROM lab_role_membership r WHERE r.lab_id = l.id) AS staff_count
  FROM lab l`;

function toDto(row: LabRow): LabSummary {
  return {
    id: row.id,
    name: row.name,
    legalName: row.legal_name,
    address: row.address,
    accreditationBody: row.accreditation_body,
    accreditationNumber: row.accreditation_number,
    turnaroundTargetDays: row.turnaround_target_days,
    status: row.status,
    staffCount: Number(row.staff_count),
    createdAt: row.created_at.toISOString(),
  };
}

export async function listLabs(manager: EntityManager, query: ListQuery): Promise<Page<LabSummary>> {
  const { skip, take } = pageParams(query);
  const q = query.q ? escapeLike(query.q) : null;
  const where = `WHERE ($1::text IS NULL OR l.name ILIKE $1 OR l.legal_name ILIKE $1)`;
  const [rows, total] = await Promise.all([
    manager.query(`${SELECT} ${where} ORDER BY ${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, l.id LIMIT $2 OFFSET $3`, [q, take, skip]) as Promise<LabRow[]>,
    cappedCount(manager, `FROM lab l ${where}`, [q], totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(toDto), total, query);
}

export async function findLab(manager: EntityManager, id: string): Promise<LabSummary | null> {
  const rows: LabRow[] = await manager.query(`${SELECT} WHERE l.id = $1`, [id]);
  return rows[0] ? toDto(rows[0]) : null;
}
