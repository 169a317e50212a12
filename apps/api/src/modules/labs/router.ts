import { Router } from 'express';
import { LAB_ROLES, LabProfileSchema, UpdateLabProfileRequestSchema, type UpdateLabProfileRequest } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { recordAudit } from '../audit/record-audit';
import { requireRole } from '../auth/require-auth';
import { Lab } from './lab.entity';
import { toLabProfile } from './lab-profile';

const tag = 'Lab profile';

/** The signed-in user's own lab: every staff member reads it, the lab admin edits it. */
export function labProfileRouter(): Router {
  const router = Router();

  registerRoute({ method: 'get', path: '/lab/profile', tag, summary: 'My lab’s profile (name, address, accreditation, turnaround)', roles: LAB_ROLES, response: LabProfileSchema });
  router.get('/', requireRole(...LAB_ROLES), async (_req, res) => {
    const lab = await dataSource.manager.findOneBy(Lab, { id: labIdOf(res.locals.auth) });
    if (!lab) throw ApiError.notFound('Lab');
    res.json(toLabProfile(lab));
  });

  registerRoute({ method: 'patch', path: '/lab/profile', tag, summary: 'Change my lab’s profile', roles: ['lab-admin'], body: UpdateLabProfileRequestSchema, response: LabProfileSchema });
  router.patch('/', requireRole('lab-admin'), validate({ body: UpdateLabProfileRequestSchema }), async (_req, res) => {
    const changes = res.locals.body as UpdateLabProfileRequest;
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const lab = await dataSource.transaction(async (manager) => {
      if (changes.name) {
        const [clash] = await manager.query('SELECT 1 FROM lab WHERE lower(name) = lower($1) AND id <> $2', [changes.name, labId]);
        if (clash) throw ApiError.conflict(`A lab named ${changes.name} already exists.`, [{ field: 'name', message: 'is already used by another lab' }]);
      }
      const before = await manager.findOneOrFail(Lab, { where: { id: labId }, lock: { mode: 'pessimistic_write' } });
      await manager.update(Lab, labId, changes);
      const changed = Object.fromEntries(Object.keys(changes).map((k) => [k, { before: before[k as keyof Lab], after: changes[k as keyof UpdateLabProfileRequest] }]));
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'lab.profile-changed', subjectType: 'lab', subjectId: labId, details: changed });
      return manager.findOneByOrFail(Lab, { id: labId });
    });
    res.json(toLabProfile(lab));
  });

  return router;
}
