import type { EntityManager } from 'typeorm';
import type { ClientOrganisation as ClientOrganisationDto, ListQuery, Page } from '@ohmprint/contracts';
import { escapeLike, pageParams, toPage } from '../../core/paging';

const SORT_COLUMNS: Record<string, string> = { name: 'lower(o.name)', createdAt: 'o.created_at' };

interface OrganisationRow {
  id: string;
  name: string;
  contact_email: string | null;
  created_at: Date;
  member_count: string;
  total: string;
}

const SELECT = `
  SELECT o.id, o.name, o.contact_email, o.created_at,
         (SELECT count(*) FROM client_membership cm JOIN app_user u ON u.id = cm.user_id
           WHERE cm.lab_id = o.lab_id AND cm.client_organisation_id = o.id AND u.status = 'active') AS member_count,
         count(*) OVER () AS total
  FROM client_organisation o
  WHERE o.lab_id = $1`;

function toDto(row: OrganisationRow): ClientOrganisationDto {
  return { id: row.id, name: row.name, contactEmail: row.contact_email, memberCount: Number(row.member_count), createdAt: row.created_at.toISOString() };
}

export async function listOrganisations(manager: EntityManager, labId: string, query: ListQuery): Promise<Page<ClientOrganisationDto>> {
  const { skip, take } = pageParams(query);
  const q = query.q ? escapeLike(query.q) : null;
  const rows: OrganisationRow[] = await manager.query(
    `${SELECT} AND ($2::text IS NULL OR o.name ILIKE $2 OR o.contact_email ILIKE $2)
     ORDER BY ${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, o.id LIMIT $3 OFFSET $4`,
    [labId, q, take, skip],
  );
  let total = rows.length ? Number(rows[0].total) : 0;
  if (!rows.length && skip > 0) {
    const [row] = await manager.query(`SELECT count(*) AS n FROM client_organisation o WHERE o.lab_id = $1 AND ($2::text IS NULL OR o.name ILIKE $2 OR o.contact_email ILIKE $2)`, [labId, q]);
    total = Number(row.n);
  }
  return toPage(rows.map(toDto), total, query);
}

export async function findOrganisation(manager: EntityManager, labId: string, id: string): Promise<ClientOrganisationDto | null> {
  const rows: OrganisationRow[] = await manager.query(`${SELECT} AND o.id = $2`, [labId, id]);
  return rows[0] ? toDto(rows[0]) : null;
}
