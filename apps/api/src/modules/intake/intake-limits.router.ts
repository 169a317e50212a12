import type { Router } from 'express';
import { IntakeLimitsSchema, UpdateIntakeLimitsSchema, type UpdateIntakeLimits } from '@ohmprint/contracts';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { LAB_STAFF } from '../samples/lab-roles';
import { labIntakeLimits } from './intake-guardrails';

const tag = 'Intake';

/** The lab's intake limits per matrix: what intake accepts without a second look. */
export function intakeLimitsRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/lab/intake-limits', tag, summary: 'Arrival temperature range and maximum sample age per matrix, with where they come from',
    roles: LAB_STAFF, response: IntakeLimitsSchema }, async (_req, res) => {
    res.json(await labIntakeLimits(dataSource.manager, labIdOf(res.locals.auth)));
  });

  route({ method: 'put', path: '/lab/intake-limits', tag, summary: 'Set the lab’s own intake limits (matrices left out keep the defaults)',
    roles: ['lab-admin'], body: UpdateIntakeLimitsSchema, response: IntakeLimitsSchema }, async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const { limits } = res.locals.body as UpdateIntakeLimits;
    await dataSource.transaction(async (m) => {
      await m.query('UPDATE lab SET intake_limits = $2 WHERE id = $1', [labId, JSON.stringify(limits)]);
      await recordAudit(m, { labId, actorUserId: res.locals.auth.userId, action: 'lab.intake-limits-changed', subjectType: 'lab', subjectId: labId, details: { limits } });
    });
    res.json(await labIntakeLimits(dataSource.manager, labId));
  });

  return router;
}
