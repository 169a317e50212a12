import type { Router } from 'express';
import type { EntityManager } from 'typeorm';
import { LAB_LOGO_MAX_BYTES, LAB_ROLES, LabProfileSchema, UpdateLabProfileRequestSchema, type UpdateLabProfileRequest } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { routeTable } from '../../core/route-table';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { recordAudit } from '../audit/record-audit';
import { singleFileUpload } from '../reports/single-file-upload';
import { Lab } from './lab.entity';
import { toLabProfile } from './lab-profile';
import { readLogo } from './logo-image';

const tag = 'Lab profile';

async function profileOf(manager: EntityManager, labId: string) {
  const lab = await manager.findOneBy(Lab, { id: labId });
  if (!lab) throw ApiError.notFound('Lab');
  const [{ size }] = await manager.query('SELECT octet_length(logo) AS size FROM lab WHERE id = $1', [labId]);
  return toLabProfile(lab, size === null ? null : Number(size));
}

/** The signed-in user's own lab: every staff member reads it, the lab admin edits it and its logo. */
export function labProfileRouter(): Router {
  const { router, route } = routeTable();

  route({ method: 'get', path: '/lab/profile', tag, summary: 'My lab’s profile (name, address, accreditation, contact, shipping, logo facts)',
    roles: LAB_ROLES, response: LabProfileSchema }, async (_req, res) => {
    res.json(await profileOf(dataSource.manager, labIdOf(res.locals.auth)));
  });

  route({ method: 'patch', path: '/lab/profile', tag, summary: 'Change my lab’s profile (audited with before and after)',
    roles: ['lab-admin'], body: UpdateLabProfileRequestSchema, response: LabProfileSchema }, async (_req, res) => {
    const changes = res.locals.body as UpdateLabProfileRequest;
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const profile = await dataSource.transaction(async (manager) => {
      if (changes.name) {
        const [clash] = await manager.query('SELECT 1 FROM lab WHERE lower(name) = lower($1) AND id <> $2', [changes.name, labId]);
        if (clash) throw ApiError.conflict(`A lab named ${changes.name} already exists.`, [{ field: 'name', message: 'is already used by another lab' }]);
      }
      const before = await manager.findOneOrFail(Lab, { where: { id: labId }, lock: { mode: 'pessimistic_write' } });
      await manager.update(Lab, labId, changes);
      const changed = Object.fromEntries(Object.keys(changes).map((k) => [k, { before: before[k as keyof Lab], after: changes[k as keyof UpdateLabProfileRequest] }]));
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'lab.profile-changed', subjectType: 'lab', subjectId: labId, details: changed });
      return profileOf(manager, labId);
    });
    res.json(profile);
  });

  route({ method: 'get', path: '/lab/profile/logo', tag, summary: 'My lab’s logo image (PNG or JPEG); 404 when none',
    roles: LAB_ROLES, responseMediaType: 'image/png' }, async (_req, res) => {
    const [row]: Array<{ logo: Buffer | null; logo_content_type: string | null }> = await dataSource.query(
      'SELECT logo, logo_content_type FROM lab WHERE id = $1',
      [labIdOf(res.locals.auth)],
    );
    if (!row?.logo || !row.logo_content_type) throw ApiError.notFound('Logo');
    res.set('Cache-Control', 'private, no-cache').type(row.logo_content_type).send(row.logo);
  });

  route({ method: 'put', path: '/lab/profile/logo', tag,
    summary: `Upload my lab’s logo (multipart field "logo", PNG or JPEG checked by content, ≤ ${LAB_LOGO_MAX_BYTES / 1024} KB); printed in the report header`,
    roles: ['lab-admin'], requestMediaType: 'multipart/form-data', response: LabProfileSchema,
    before: [singleFileUpload('logo', LAB_LOGO_MAX_BYTES, 'logo')] }, async (req, res) => {
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const file = req.file!;
    const image = readLogo(file.buffer, file.originalname);
    const profile = await dataSource.transaction(async (manager) => {
      await manager.query(
        `UPDATE lab SET logo = $2, logo_content_type = $3, logo_width_px = $4, logo_height_px = $5, logo_updated_at = now(), updated_at = now() WHERE id = $1`,
        [labId, file.buffer, image.contentType, image.widthPx, image.heightPx],
      );
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'lab.logo-changed', subjectType: 'lab', subjectId: labId,
        details: { fileName: file.originalname, contentType: image.contentType, sizeBytes: file.size, widthPx: image.widthPx, heightPx: image.heightPx } });
      return profileOf(manager, labId);
    });
    res.json(profile);
  });

  route({ method: 'delete', path: '/lab/profile/logo', tag, summary: 'Remove my lab’s logo (reports then carry the lab’s name only)',
    roles: ['lab-admin'], response: LabProfileSchema }, async (_req, res) => {
    const auth = res.locals.auth;
    const labId = labIdOf(auth);
    const profile = await dataSource.transaction(async (manager) => {
      await manager.query(
        'UPDATE lab SET logo = NULL, logo_content_type = NULL, logo_width_px = NULL, logo_height_px = NULL, logo_updated_at = NULL, updated_at = now() WHERE id = $1',
        [labId],
      );
      await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'lab.logo-removed', subjectType: 'lab', subjectId: labId });
      return profileOf(manager, labId);
    });
    res.json(profile);
  });

  return router;
}
