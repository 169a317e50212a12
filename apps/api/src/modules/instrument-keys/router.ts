import { Router } from 'express';
import { z } from 'zod';
import { CreateInstrumentKeySchema, IdParamsSchema, InstrumentKeySchema, IssuedInstrumentKeySchema, type CreateInstrumentKey } from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { issueInstrumentKey, listInstrumentKeys, revokeInstrumentKey } from './instrument-key-service';

const tag = 'Instrument keys';

/** Lab admins issue and revoke the keys bench computers post measurements with (mounted at /lab). */
export function instrumentKeysRouter(): Router {
  const router = Router();
  const admin = requireRole('lab-admin');

  registerRoute({ method: 'get', path: '/lab/instrument-keys', tag, summary: 'The lab’s instrument keys (prefix, last use, revocation; never the secret)', roles: ['lab-admin'], response: z.array(InstrumentKeySchema) });
  router.get('/instrument-keys', admin, async (_req, res) => {
    res.json(await listInstrumentKeys(dataSource.manager, labIdOf(res.locals.auth)));
  });

  registerRoute({ method: 'post', path: '/lab/instrument-keys', tag, summary: 'Issue a key for a bench computer; the full key (ohmbench-…) is shown in this answer only', roles: ['lab-admin'], body: CreateInstrumentKeySchema, response: IssuedInstrumentKeySchema, status: 201 });
  router.post('/instrument-keys', admin, validate({ body: CreateInstrumentKeySchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const issued = await dataSource.transaction((m) => issueInstrumentKey(m, res.locals.auth, labId, (res.locals.body as CreateInstrumentKey).name));
    res.setHeader('Cache-Control', 'no-store');
    res.status(201).json(issued);
  });

  registerRoute({ method: 'post', path: '/lab/instrument-keys/:id/revoke', tag, summary: 'Revoke a key; the bench computer holding it is refused from then on', roles: ['lab-admin'], params: IdParamsSchema, response: InstrumentKeySchema });
  router.post('/instrument-keys/:id/revoke', admin, validate({ params: IdParamsSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    res.json(await dataSource.transaction((m) => revokeInstrumentKey(m, res.locals.auth, labId, (res.locals.params as { id: string }).id)));
  });

  return router;
}
