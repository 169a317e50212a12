import type { EntityManager } from 'typeorm';
import type { ClientOrganisation as ClientOrganisationDto, ListQuery, Page } from '@ohmprint/contracts';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

const SORT_COLUMNS: Record<string, string> = { name: 'lower(o.name)', createdAt: 'o.created_at' };

interface OrganisationRow {
  id: string;
  name: string;
  contact_email: string | null;
  created_at: Date;
  member_count: string;
}

const SELECT = `
  SELECT o.id, o.name, o.contact_email, o.created_at,
         (SELECT count(*) FROM client_membership cm JOIN app_user u ON u.id = cm.user_id
           WHERE cm.lab_id = o.lab_id AND cm.client_organisation_id = o.id AND u.status = 'active') AS member_count
  FROM client_organisation o
  WHERE o.lab_id = $1`;

function toDto(row: OrganisationRow): ClientOrganisationDto {
  return { id: row.id, name: row.name, contactEmail: row.contact_email, memberCount: Number(row.member_count), createdAt: row.created_at.toISOString() };
}

export async function listOrganisations(manager: EntityManager, labId: string, query: ListQuery): Promise<Page<ClientOrganisationDto>> {
  const { skip, take } = pageParams(query);
  const q = query.q ? escapeLike(query.q) : null;
  const search = `AND ($2::text IS NULL OR o.name ILIKE $2 OR o.contact_email ILIKE $2)`;
  const [rows, total] = await Promise.all([
    manager.query(
      `${SELECT} ${search}
       ORDER BY ${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, o.id LIMIT $3 OFFSET $4`,
      [labId, q, take, skip],
    ) as Promise<OrganisationRow[]>,
    cappedCount(manager, `FROM client_organisation o WHERE o.lab_id = $1 ${search}`, [labId, q], totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(toDto), total, query);
}

export async function findOrganisation(manager: EntityManager, labId: string, id: string): Promise<ClientOrganisationDto | null> {
  const rows: OrganisationRow[] = await manager.query(`${SELECT} AND o.id = $2`, [labId, id]);
  return rows[0] ? toDto(rows[0]) : null;
}
