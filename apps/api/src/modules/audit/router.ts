import type { Router } from 'express';
import { AuditEventSchema, AuditLogQuerySchema, pageOf, type AuditEventEntry, type AuditLogQuery } from '@ohmprint/contracts';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor, type CappedTotal } from '../../core/paging';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { routeTable } from '../../core/route-table';

const tag = 'Audit log';
const SORT_COLUMNS: Record<string, string> = { createdAt: 'e.created_at', action: 'e.action' };

interface AuditRow {
  id: string;
  action: string;
  subject_type: string;
  subject_id: string | null;
  details: Record<string, unknown>;
  created_at: Date;
  actor_id: string | null;
  actor_name: string | null;
  actor_email: string | null;
}

/** The lab admin's view of everything recorded in their lab, newest first. */
export function auditLogRouter(): Router {
  const { router, route } = routeTable();
  route({ method: 'get', path: '/lab/audit-events', tag, summary: 'My lab’s audit log, filterable by action and subject', roles: ['lab-admin'], query: AuditLogQuerySchema, response: pageOf(AuditEventSchema) }, async (_req, res) => {
    const query = res.locals.query as AuditLogQuery;
    const { skip, take } = pageParams(query);
    const params = [labIdOf(res.locals.auth), query.q ? escapeLike(query.q) : null, query.action ?? null, query.subjectType ?? null, query.subjectId ?? null];
    const where = `WHERE e.lab_id = $1 AND ($2::text IS NULL OR e.action ILIKE $2) AND ($3::text IS NULL OR e.action = $3)
                     AND ($4::text IS NULL OR e.subject_type = $4) AND ($5::text IS NULL OR e.subject_id = $5)`;
    const order = `${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, e.id ${query.dir === 'desc' ? 'DESC' : 'ASC'}`;
    const [rows, counted]: [AuditRow[], CappedTotal] = await Promise.all([
      dataSource.query(
        `SELECT e.id, e.action, e.subject_type, e.subject_id, e.details, e.created_at,
                u.id AS actor_id, u.display_name AS actor_name, u.email AS actor_email
         FROM (SELECT e.* FROM audit_event e JOIN (SELECT e.id FROM audit_event e ${where} ORDER BY ${order} LIMIT $6 OFFSET $7) page USING (id)) e LEFT JOIN app_user u ON u.id = e.actor_user_id
         ORDER BY ${order}`,
        [...params, take, skip],
      ),
      cappedCount(dataSource.manager, `FROM audit_event e ${where}`, params, totalCapFor(query)),
    ]);
    const items: AuditEventEntry[] = rows.map((r) => ({
      id: r.id,
      action: r.action,
      subjectType: r.subject_type,
      subjectId: r.subject_id,
      actor: r.actor_id ? { id: r.actor_id, displayName: r.actor_name ?? '', email: r.actor_email ?? '' } : null,
      details: r.details,
      createdAt: r.created_at.toISOString(),
    }));
    res.json(toCappedPage(items, counted, query));
  });
  return router;
}
