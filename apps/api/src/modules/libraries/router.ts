import { Router } from 'express';
import {
  IdParamsSchema,
  LibraryListQuerySchema,
  LibraryPageSchema,
  LibraryVersionDetailSchema,
  MethodSettingsSchema,
  ReferenceSpectraSchema,
  type LibraryListQuery,
  type MethodSettings,
} from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { recordAudit } from '../audit/record-audit';
import { requireRole } from '../auth/require-auth';
import { LAB_STAFF } from '../samples/lab-roles';
import { labMethod } from './lab-method';
import { libraryVersionDetail, listLibraries } from './library-views';
import { referenceSpectra } from './reference-spectra';
import { LabMethodSettings } from './method-settings.entity';

const tag = 'Reference libraries';

/** Reference libraries and the lab's method settings (mounted at /lab). */
export function librariesRouter(): Router {
  const router = Router();

  registerRoute({ method: 'get', path: '/lab/libraries', tag, summary: 'Reference libraries with their versions (T95/T99, lot counts)', roles: LAB_STAFF, query: LibraryListQuerySchema, response: LibraryPageSchema });
  router.get('/libraries', requireRole(...LAB_STAFF), validate({ query: LibraryListQuerySchema }), async (_req, res) => {
    res.json(await listLibraries(dataSource.manager, labIdOf(res.locals.auth), res.locals.query as LibraryListQuery));
  });

  registerRoute({ method: 'get', path: '/lab/library-versions/:id', tag, summary: 'One library version: frozen method, calibration and lots', roles: LAB_STAFF, params: IdParamsSchema, response: LibraryVersionDetailSchema });
  router.get('/library-versions/:id', requireRole(...LAB_STAFF), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await libraryVersionDetail(dataSource.manager, labIdOf(res.locals.auth), (res.locals.params as { id: string }).id));
  });

  registerRoute({ method: 'get', path: '/lab/library-versions/:id/reference-spectra', tag, summary: 'A published version’s lots, normalised and on its grid (the reference band behind a sample)', roles: ['analyst', 'reviewer', 'lab-admin'], params: IdParamsSchema, response: ReferenceSpectraSchema });
  router.get('/library-versions/:id/reference-spectra', requireRole('analyst', 'reviewer', 'lab-admin'), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await referenceSpectra(dataSource.manager, labIdOf(res.locals.auth), (res.locals.params as { id: string }).id));
  });

  registerRoute({ method: 'get', path: '/lab/method-settings', tag, summary: 'The lab’s current method (new library versions copy it)', roles: LAB_STAFF, response: MethodSettingsSchema });
  router.get('/method-settings', requireRole(...LAB_STAFF), async (_req, res) => {
    res.json(await labMethod(dataSource.manager, labIdOf(res.locals.auth)));
  });

  registerRoute({ method: 'put', path: '/lab/method-settings', tag, summary: 'Change the lab’s method; published versions keep the copy they were frozen with', roles: ['lab-admin'], body: MethodSettingsSchema, response: MethodSettingsSchema });
  router.put('/method-settings', requireRole('lab-admin'), validate({ body: MethodSettingsSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const settings = res.locals.body as MethodSettings;
    await dataSource.transaction(async (m) => {
      const before = await labMethod(m, labId);
      await m.upsert(LabMethodSettings, { labId, settings, updatedByUserId: res.locals.auth.userId, updatedAt: new Date() }, ['labId']);
      await recordAudit(m, { labId, actorUserId: res.locals.auth.userId, action: 'method.settings-changed', subjectType: 'lab', subjectId: labId, details: { before, after: settings } });
    });
    res.json(settings);
  });

  return router;
}
