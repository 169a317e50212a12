import type { Router } from 'express';
import { AuditEventSchema, AuditLogQuerySchema, pageOf, type AuditEventEntry, type AuditLogQuery } from '@ohmprint/contracts';
import { escapeLike, pageParams, toPage } from '../../core/paging';
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
  total: string;
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
    const rows: AuditRow[] = await dataSource.query(
      `SELECT e.id, e.action, e.subject_type, e.subject_id, e.details, e.created_at,
              u.id AS actor_id, u.display_name AS actor_name, u.email AS actor_email, count(*) OVER () AS total
       FROM audit_event e LEFT JOIN app_user u ON u.id = e.actor_user_id
       ${where}
       ORDER BY ${SORT_COLUMNS[query.sort]} ${query.dir === 'desc' ? 'DESC' : 'ASC'}, e.id LIMIT $6 OFFSET $7`,
      [...params, take, skip],
    );
    let total = rows.length ? Number(rows[0].total) : 0;
    if (!rows.length && skip > 0) total = Number((await dataSource.query(`SELECT count(*) AS n FROM audit_event e ${where}`, params))[0].n);
    const items: AuditEventEntry[] = rows.map((r) => ({
      id: r.id,
      action: r.action,
      subjectType: r.subject_type,
      subjectId: r.subject_id,
      actor: r.actor_id ? { id: r.actor_id, displayName: r.actor_name ?? '', email: r.actor_email ?? '' } : null,
      details: r.details,
      createdAt: r.created_at.toISOString(),
    }));
    res.json(toPage(items, total, query));
  });
  return router;
}
