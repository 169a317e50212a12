import { Router } from 'express';
import { z } from 'zod';
import {
  BenchEquipmentSchema,
  ExcludeReplicateSchema,
  IdParamsSchema,
  MeasurementUploadFieldsSchema,
  MeasurementUploadResultSchema,
  RecordCellCalibrationSchema,
  SampleMeasurementsSchema,
  SpectrumPointsSchema,
  type ExcludeReplicate,
  type MeasurementUploadFields,
  type RecordCellCalibration,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { labIdOf } from '../../core/tenancy';
import { validate } from '../../core/validate';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { requireRole } from '../auth/require-auth';
import { requireMeasurementUploader } from '../instrument-keys/measurement-uploader';
import { LAB_STAFF } from '../samples/lab-roles';
import { tenantBoundedUpload } from '../samples/tenant-bounded-upload';
import { benchEquipment, recordCellCalibration } from './bench-equipment';
import { Replicate } from './replicate.entity';
import { excludeReplicate, replicateSpectrum, sampleMeasurements } from './sample-measurements';
import { CONCURRENT_UPLOADS_PER_LAB, MEASUREMENT_LIMITS, uploadMeasurements } from './upload-measurements';

const tag = 'Measurements';
const ReplicateParamsSchema = z.object({ id: z.uuid(), replicateId: z.uuid() });
const UploadParamsSchema = z.object({ id: z.string().trim().min(1).max(60).meta({ description: 'Sample id, or its printed code (OP-XXXX-XX)' }) });
const UploadBodySchema = z.object({
  ...MeasurementUploadFieldsSchema.shape,
  files: z.array(z.string().meta({ format: 'binary' })).meta({ description: 'One instrument export (text) per replicate: at most 20 files, each at most 5 MB and 5,000 rows' }),
});

/** Bench equipment, measurement uploads and replicates (mounted at /lab). */
export function measurementsRouter(): Router {
  const router = Router();
  // Files stream to a private temporary folder (removed when the answer is sent) and are parsed from there in the worker pool.
  // Two uploads of one lab at a time in this process: a third waits for its turn (429, Retry-After) before its files are read.
  const upload = tenantBoundedUpload({ limits: MEASUREMENT_LIMITS, select: (m) => m.array('files'), perTenant: CONCURRENT_UPLOADS_PER_LAB,
    what: 'measurement uploads of one lab', tenantOf: (res) => String(res.locals.uploaderLabId) });
  const analyst = requireRole('analyst');
  const ids = (params: unknown) => params as z.infer<typeof ReplicateParamsSchema>;

  registerRoute({ method: 'get', path: '/lab/bench', tag, summary: 'Instruments and cells, each cell with its newest KCl calibration', roles: LAB_STAFF, response: BenchEquipmentSchema });
  router.get('/bench', requireRole(...LAB_STAFF), async (_req, res) => {
    res.json(await benchEquipment(dataSource.manager, labIdOf(res.locals.auth)));
  });

  registerRoute({ method: 'post', path: '/lab/cells/:id/calibrations', tag, summary: 'Record a KCl check of a cell: K = κ_standard · R_plateau', roles: ['analyst', 'lab-admin'], params: IdParamsSchema, body: RecordCellCalibrationSchema, response: BenchEquipmentSchema, status: 201 });
  router.post('/cells/:id/calibrations', requireRole('analyst', 'lab-admin'), validate({ params: IdParamsSchema, body: RecordCellCalibrationSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const body = res.locals.body as RecordCellCalibration;
    res.status(201).json(await dataSource.transaction((m) => recordCellCalibration(m, res.locals.auth, labId, (res.locals.params as { id: string }).id, body)));
  });

  registerRoute({
    method: 'post',
    path: '/lab/samples/:id/measurements',
    tag,
    summary:
      'Upload instrument exports, one file per replicate (multipart field "files"). Signed-in analysts, or a bench computer with "Authorization: Bearer ohmbench-…" (an instrument key; this is the only route a key opens). Unreadable files are listed with file name, line and column; the readable ones are still saved.',
    roles: ['analyst'],
    params: UploadParamsSchema,
    body: UploadBodySchema,
    requestMediaType: 'multipart/form-data',
    response: MeasurementUploadResultSchema,
    status: 201,
  });
  router.post('/samples/:id/measurements', requireMeasurementUploader, validate({ params: UploadParamsSchema }), ...upload, validate({ body: MeasurementUploadFieldsSchema }), async (req, res) => {
    const files = (req.files as Express.Multer.File[] | undefined) ?? [];
    const result = await uploadMeasurements(res.locals.uploader, res.locals.uploaderLabId, (res.locals.params as { id: string }).id, res.locals.body as MeasurementUploadFields, files);
    res.status(201).json(result);
  });

  registerRoute({ method: 'get', path: '/lab/samples/:id/measurements', tag, summary: 'The sample’s replicates with their Kramers–Kronig results, and replicate agreement', roles: LAB_STAFF, params: IdParamsSchema, response: SampleMeasurementsSchema });
  router.get('/samples/:id/measurements', requireRole(...LAB_STAFF), validate({ params: IdParamsSchema }), async (_req, res) => {
    res.json(await sampleMeasurements(dataSource.manager, labIdOf(res.locals.auth), (res.locals.params as { id: string }).id));
  });

  registerRoute({ method: 'get', path: '/lab/samples/:id/replicates/:replicateId/spectrum', tag, summary: 'One replicate’s spectrum as measured (Hz, Ω) for Bode and Nyquist plots', roles: LAB_STAFF, params: ReplicateParamsSchema, response: SpectrumPointsSchema });
  router.get('/samples/:id/replicates/:replicateId/spectrum', requireRole(...LAB_STAFF), validate({ params: ReplicateParamsSchema }), async (_req, res) => {
    const p = ids(res.locals.params);
    res.json(await replicateSpectrum(dataSource.manager, labIdOf(res.locals.auth), p.id, p.replicateId));
  });

  registerRoute({ method: 'get', path: '/lab/samples/:id/replicates/:replicateId/file', tag, summary: 'The instrument export exactly as uploaded', roles: LAB_STAFF, params: ReplicateParamsSchema, responseMediaType: 'application/octet-stream' });
  router.get('/samples/:id/replicates/:replicateId/file', requireRole(...LAB_STAFF), validate({ params: ReplicateParamsSchema }), async (_req, res) => {
    const p = ids(res.locals.params);
    const r = await dataSource.manager
      .createQueryBuilder(Replicate, 'r')
      .addSelect('r.rawFile')
      .where('r.id = :rid AND r.sample_id = :sid AND r.lab_id = :lab', { rid: p.replicateId, sid: p.id, lab: labIdOf(res.locals.auth) })
      .getOne();
    if (!r) throw ApiError.notFound('Replicate');
    res.attachment(r.fileName).type('application/octet-stream').send(r.rawFile);
  });

  registerRoute({ method: 'post', path: '/lab/samples/:id/replicates/:replicateId/exclude', tag, summary: 'Exclude a replicate from analysis, with a reason (audited)', roles: ['analyst'], params: ReplicateParamsSchema, body: ExcludeReplicateSchema, response: SampleMeasurementsSchema });
  router.post('/samples/:id/replicates/:replicateId/exclude', analyst, validate({ params: ReplicateParamsSchema, body: ExcludeReplicateSchema }), async (_req, res) => {
    const labId = labIdOf(res.locals.auth);
    const p = ids(res.locals.params);
    await dataSource.transaction((m) => excludeReplicate(m, res.locals.auth, labId, p.id, p.replicateId, res.locals.body as ExcludeReplicate));
    res.json(await sampleMeasurements(dataSource.manager, labId, p.id));
  });

  return router;
}
