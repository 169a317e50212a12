import { ApiError } from '../../core/api-error';
import type { EntityManager } from 'typeorm';
import type { LabRole, ListQuery, Page, StaffMember } from '@ohmprint/contracts';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

const SORT_COLUMNS: Record<string, string> = { displayName: 'u.display_name', email: 'u.email', createdAt: 'u.created_at' };

interface StaffRow {
  id: string;
  email: string;
  display_name: string;
  status: 'active' | 'deactivated';
  created_at: Date;
  roles: LabRole[];
}

function toStaffMember(row: StaffRow): StaffMember {
  return { id: row.id, email: row.email, displayName: row.display_name, roles: row.roles, status: row.status, createdAt: row.created_at.toISOString() };
}

/** Staff are the lab's users who are not client users. */
const STAFF_FROM = `
  FROM app_user u
  WHERE u.lab_id = $1 AND NOT EXISTS (SELECT 1 FROM client_membership cm WHERE cm.user_id = u.id)`;
const ROLES = `ARRAY(SELECT r.role FROM lab_role_membership r WHERE r.user_id = u.id AND r.lab_id = u.lab_id ORDER BY r.role) AS roles`;

export async function listStaff(manager: EntityManager, labId: string, query: ListQuery): Promise<Page<StaffMember>> {
  const { skip, take } = pageParams(query);
  const search = `AND ($2::text IS NULL OR u.email ILIKE $2 OR u.display_name ILIKE $2)`;
  const params = [labId, query.q ? escapeLike(query.q) : null];
  const [rows, total] = await Promise.all([
    manager.query(
      `SELECT u.id, u.email, u.display_name, u.status, u.created_at, ${ROLES}
       ${STAFF_FROM} ${search}
       ORDER BY ${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, u.id
       LIMIT $3 OFFSET $4`,
      [...params, take, skip],
    ) as Promise<StaffRow[]>,
    cappedCount(manager, `${STAFF_FROM} ${search}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(toStaffMember), total, query);
}

/** One staff member of this lab, or null (also for another lab's user or a client user). */
export async function findStaffMember(manager: EntityManager, labId: string, userId: string): Promise<StaffMember | null> {
  const rows: StaffRow[] = await manager.query(`SELECT u.id, u.email, u.display_name, u.status, u.created_at, ${ROLES} ${STAFF_FROM} AND u.id = $2`, [labId, userId]);
  return rows[0] ? toStaffMember(rows[0]) : null;
}

/** Active lab admins other than `exceptUserId`: a lab must always keep one. */
export async function otherActiveAdmins(manager: EntityManager, labId: string, exceptUserId: string): Promise<number> {
  const [row] = await manager.query(
    `SELECT count(*) AS n FROM lab_role_membership r JOIN app_user u ON u.id = r.user_id
     WHERE r.lab_id = $1 AND r.role = 'lab-admin' AND u.status = 'active' AND u.id <> $2`,
    [labId, exceptUserId],
  );
  return Number(row.n);
}

/** Refuses a caller who is no longer an active lab admin of this lab (read under the admin lock). */
export async function assertStillActiveAdmin(manager: EntityManager, labId: string, userId: string): Promise<void> {
  const [row] = await manager.query(
    `SELECT 1 AS ok FROM lab_role_membership r JOIN app_user u ON u.id = r.user_id
     WHERE r.lab_id = $1 AND r.role = 'lab-admin' AND u.status = 'active' AND u.id = $2`,
    [labId, userId],
  );
  if (!row) throw ApiError.forbidden('You are no longer an active lab admin of this lab.');
}
