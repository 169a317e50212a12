import { Router } from 'express';
import { z } from 'zod';
import {
  AcceptSampleSchema,
  IdParamsSchema,
  IntakePhotoSchema,
  RecordArrivalSchema,
  RejectSampleSchema,
  SampleDetailSchema,
  type AcceptSample,
  type RecordArrival,
  type RejectSample,
} from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { LAB_STAFF } from '../samples/lab-roles';
import { tenantBoundedUpload } from '../samples/tenant-bounded-upload';
import { sampleDetail } from '../samples/sample-views';
import { imageOnDisk } from './image-on-disk';
import { acceptSample, addPhotos, photoContent, recordArrival, rejectSample } from './intake-service';

const tag = 'Intake';
const PHOTO_LIMITS = { fileSizeBytes: 10 * 1048576, files: 12 };
export const CONCURRENT_PHOTO_UPLOADS_PER_LAB = 2;
const PhotoParamsSchema = z.object({ id: z.uuid(), photoId: z.uuid() });
const PhotoUploadSchema = z.object({ photos: z.array(z.string().meta({ format: 'binary' })).meta({ description: 'JPEG, PNG or WebP images, each at most 10 MB' }) });

/** Receiving shipments: arrival, photos, accept or reject (mounted at /lab). */
export function intakeRouter(): Router {
  const router = Router();
  // Photos stream to a private temporary folder (removed when the answer is sent), at most two uploads per lab at once.
  const upload = tenantBoundedUpload({ limits: PHOTO_LIMITS, select: (m) => m.array('photos'), perTenant: CONCURRENT_PHOTO_UPLOADS_PER_LAB,
    what: 'photo uploads of one lab', tenantOf: (res) => labIdOf(res.locals.auth) });
  const intake = requireRole('intake-technician');
  const id = (params: unknown) => (params as { id: string }).id;

  registerRoute({ method: 'post', path: '/lab/samples/:id/arrival', tag, summary: 'Record a parcel’s arrival and condition (awaiting arrival → received)', roles: ['intake-technician'], params: IdParamsSchema, body: RecordArrivalSchema, response: SampleDetailSchema });
  router.post('/samples/:id/arrival', intake, validate({ params: IdParamsSchema, body: RecordArrivalSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => recordArrival(m, res.locals.auth, labId, id(res.locals.params), res.locals.body as RecordArrival));
    res.json(await sampleDetail(dataSource.manager, labId, { id: id(res.locals.params) }));
  });

  registerRoute({ method: 'post', path: '/lab/samples/:id/photos', tag, summary: 'Add intake photos (multipart field "photos"; JPEG, PNG or WebP, ≤ 10 MB each)', roles: ['intake-technician'], params: IdParamsSchema, body: PhotoUploadSchema, requestMediaType: 'multipart/form-data', response: z.array(IntakePhotoSchema), status: 201 });
  router.post('/samples/:id/photos', intake, validate({ params: IdParamsSchema }), ...upload, async (req, res) => {
    const labId = labIdOf(res.locals.auth);
    const files = await Promise.all(((req.files as Express.Multer.File[] | undefined) ?? []).map(imageOnDisk));
    res.status(201).json(await dataSource.transaction((m) => addPhotos(m, res.locals.auth, labId, id(res.locals.params), files)));
  });

  registerRoute({ method: 'get', path: '/lab/samples/:id/photos/:photoId', tag, summary: 'One intake photo as an image', roles: LAB_STAFF, params: PhotoParamsSchema, responseMediaType: 'image/*' });
  router.get('/samples/:id/photos/:photoId', requireRole(...LAB_STAFF), validate({ params: PhotoParamsSchema }), async (_req, res) => {
    const p = res.locals.params as z.infer<typeof PhotoParamsSchema>;
    const photo = await photoContent(dataSource.manager, labIdOf(res.locals.auth), p.id, p.photoId);
    res.setHeader('Content-Disposition', `inline; filename="${encodeURIComponent(photo.fileName)}"`);
    res.setHeader('Cache-Control', 'private, max-age=3600');
    res.type(photo.contentType).send(photo.content);
  });

  registerRoute({ method: 'post', path: '/lab/samples/:id/accept', tag, summary: 'Accept a received sample for testing and store it', roles: ['intake-technician'], params: IdParamsSchema, body: AcceptSampleSchema, response: SampleDetailSchema });
  router.post('/samples/:id/accept', intake, validate({ params: IdParamsSchema, body: AcceptSampleSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => acceptSample(m, res.locals.auth, labId, id(res.locals.params), res.locals.body as AcceptSample));
    res.json(await sampleDetail(dataSource.manager, labId, { id: id(res.locals.params) }));
  });

  registerRoute({ method: 'post', path: '/lab/samples/:id/reject', tag, summary: 'Reject a received sample with a reason; the client’s admins are e-mailed', roles: ['intake-technician'], params: IdParamsSchema, body: RejectSampleSchema, response: SampleDetailSchema });
  router.post('/samples/:id/reject', intake, validate({ params: IdParamsSchema, body: RejectSampleSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    await dataSource.transaction((m) => rejectSample(m, res.locals.auth, labId, id(res.locals.params), res.locals.body as RejectSample));
    res.json(await sampleDetail(dataSource.manager, labId, { id: id(res.locals.params) }));
  });

  return router;
}
