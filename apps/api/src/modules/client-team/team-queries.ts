import type { EntityManager } from 'typeorm';
import type { ClientTeamMember, ListQuery, Page } from '@ohmprint/contracts';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

const SORT_COLUMNS: Record<string, string> = { displayName: 'u.display_name', email: 'u.email', createdAt: 'cm.created_at' };

interface MemberRow {
  id: string;
  email: string;
  display_name: string;
  role: ClientTeamMember['role'];
  created_at: Date;
}

/** Active members of one organisation of one lab: both ids come from the signed-in user. */
const FROM = `
  FROM client_membership cm JOIN app_user u ON u.id = cm.user_id
  WHERE cm.lab_id = $1 AND cm.client_organisation_id = $2 AND u.status = 'active'`;

function toDto(row: MemberRow): ClientTeamMember {
  return { id: row.id, email: row.email, displayName: row.display_name, role: row.role, createdAt: row.created_at.toISOString() };
}

export async function listTeam(manager: EntityManager, labId: string, organisationId: string, query: ListQuery): Promise<Page<ClientTeamMember>> {
  const { skip, take } = pageParams(query);
  const q = query.q ? escapeLike(query.q) : null;
  const search = `AND ($3::text IS NULL OR u.email ILIKE $3 OR u.display_name ILIKE $3)`;
  const params = [labId, organisationId, q];
  const [rows, total] = await Promise.all([
    manager.query(
      `SELECT u.id, u.email, u.display_name, cm.role, cm.created_at ${FROM} ${search}
       ORDER BY ${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, u.id LIMIT $4 OFFSET $5`,
      [...params, take, skip],
    ) as Promise<MemberRow[]>,
    cappedCount(manager, `${FROM} ${search}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(toDto), total, query);
}

export async function findTeamMember(manager: EntityManager, labId: string, organisationId: string, userId: string): Promise<ClientTeamMember | null> {
  const rows: MemberRow[] = await manager.query(`SELECT u.id, u.email, u.display_name, cm.role, cm.created_at ${FROM} AND u.id = $3`, [labId, organisationId, userId]);
  return rows[0] ? toDto(rows[0]) : null;
}
