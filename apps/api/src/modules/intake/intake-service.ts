import type { EntityManager } from 'typeorm';
import type { AcceptSample, IntakePhoto as IntakePhotoView, RecordArrival, RejectSample } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { appendCustody } from '../custody/append-custody';
import { enqueueEmail } from '../mail/enqueue-email';
import { refreshOrderStatus } from '../orders/order-progress';
import { findLabSample, moveSample, requireSampleState } from '../samples/sample-access';
import { sampleDetail, samplePhotos } from '../samples/sample-views';
import { imageKind } from './image-kind';
import { IntakePhoto } from './intake-photo.entity';
import { SampleIntake } from './sample-intake.entity';

const INTAKE_BENCH = 'Intake bench';

/** Records the parcel on arrival: awaiting-arrival → received, and the first custody link. */
export async function recordArrival(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, arrival: RecordArrival): Promise<void> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  const arrivedAt = new Date(arrival.arrivedAt);
  if (arrivedAt.getTime() > Date.now() + 5 * 60_000) {
    throw ApiError.badRequest('The arrival time is in the future; enter when the parcel actually arrived.', [{ field: 'arrivedAt', message: 'must not be in the future' }]);
  }
  requireSampleState(sample, ['awaiting-arrival'], 'recording its arrival');
  await manager.insert(SampleIntake, { ...arrival, arrivedAt, sampleId, labId, recordedByUserId: auth.userId, recordedAt: new Date() });
  await moveSample(manager, sample, 'received', { receivedAt: arrivedAt });
  await refreshOrderStatus(manager, labId, sample.orderId);
  await appendCustody(manager, {
    labId,
    sampleId,
    kind: 'received',
    location: INTAKE_BENCH,
    reason: `Arrived by ${arrival.carrier}${arrival.trackingNumber ? ` (${arrival.trackingNumber})` : ''}`,
    actorUserId: auth.userId,
    occurredAt: arrivedAt,
  });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'sample.received', subjectType: 'sample', subjectId: sampleId, details: { code: sample.code } });
}

export interface UploadedImage {
  originalname: string;
  buffer: Buffer;
  size: number;
}

/** Stores intake photos; a file that is not a JPEG, PNG or WebP image is refused by name. */
export async function addPhotos(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, files: UploadedImage[]): Promise<IntakePhotoView[]> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  requireSampleState(sample, ['received', 'accepted', 'rejected'], 'adding intake photos');
  if (!files.length) throw ApiError.badRequest('Send one or more images in the "photos" field.', [{ field: 'photos', message: 'is required' }]);
  const kinds = files.map((f) => imageKind(f.buffer));
  const bad = files.filter((_, i) => kinds[i] === null).map((f) => f.originalname);
  if (bad.length) {
    throw ApiError.badRequest(
      `Not a JPEG, PNG or WebP image: ${bad.join(', ')}. Nothing was saved.`,
      bad.map((name) => ({ field: `photos[${name}]`, message: 'is not a JPEG, PNG or WebP image' })),
    );
  }
  const now = new Date();
  await manager.insert(
    IntakePhoto,
    files.map((f, i) => ({ labId, sampleId, fileName: f.originalname, contentType: kinds[i] as string, sizeBytes: f.size, content: f.buffer, uploadedByUserId: auth.userId, uploadedAt: now })),
  );
  return samplePhotos(manager, labId, sampleId);
}

export async function photoContent(manager: EntityManager, labId: string, sampleId: string, photoId: string): Promise<{ contentType: string; fileName: string; content: Buffer }> {
  const photo = await manager
    .createQueryBuilder(IntakePhoto, 'p')
    .addSelect('p.content')
    .where('p.id = :photoId AND p.sample_id = :sampleId AND p.lab_id = :labId', { photoId, sampleId, labId })
    .getOne();
  if (!photo) throw ApiError.notFound('Photo');
  return photo;
}

/**
 * received → accepted, and the sample goes into storage (two custody links). A sample with intake
 * warnings (seal, container, temperature, age) is accepted only with a reason, kept in the audit
 * log and the custody link.
 */
export async function acceptSample(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, body: AcceptSample): Promise<void> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  requireSampleState(sample, ['received'], 'accepting it');
  const { intakeWarnings: warnings } = await sampleDetail(manager, labId, { id: sampleId });
  if (warnings.length && !body.overrideReason) {
    throw new ApiError(409, 'Intake warnings', `${sample.code} needs a second look before it is accepted: ${warnings.map((w) => w.message).join(' ')} ` +
      'Give a reason to accept it anyway, or reject it.', { type: 'intake-warnings', errors: [...warnings, { field: 'overrideReason', message: 'is required to accept despite the warnings' }] });
  }
  await moveSample(manager, sample, 'accepted', { storageLocation: body.storageLocation });
  const acceptedBecause = warnings.length ? `Accepted despite: ${warnings.map((w) => w.message).join(' ')} Reason: ${body.overrideReason}` : 'Condition acceptable for testing';
  await appendCustody(manager, { labId, sampleId, kind: 'accepted', location: INTAKE_BENCH, reason: acceptedBecause, actorUserId: auth.userId });
  await appendCustody(manager, { labId, sampleId, kind: 'stored', location: body.storageLocation, reason: 'Stored until measurement', actorUserId: auth.userId });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'sample.accepted', subjectType: 'sample', subjectId: sampleId, details: { code: sample.code, storageLocation: body.storageLocation,
    ...(warnings.length ? { warnings: warnings.map((w) => w.message), overrideReason: body.overrideReason } : {}) } });
}

/** received → rejected; every client admin of the ordering organisation is told why. */
export async function rejectSample(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, body: RejectSample): Promise<{ notified: string[] }> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  requireSampleState(sample, ['received'], 'rejecting it');
  await moveSample(manager, sample, 'rejected', { rejectionReason: body.reason });
  await refreshOrderStatus(manager, labId, sample.orderId);
  await appendCustody(manager, { labId, sampleId, kind: 'rejected', location: INTAKE_BENCH, reason: body.reason, actorUserId: auth.userId });
  const admins: { email: string; display_name: string; client_name: string; product_name: string; lab_name: string }[] = await manager.query(
    `SELECT u.email, u.display_name, co.name AS client_name, p.name AS product_name, l.name AS lab_name
     FROM test_order o
     JOIN client_organisation co ON co.id = o.client_organisation_id AND co.lab_id = o.lab_id
     JOIN product p ON p.id = o.product_id
     JOIN lab l ON l.id = o.lab_id
     JOIN client_membership cm ON cm.client_organisation_id = co.id AND cm.lab_id = o.lab_id AND cm.role = 'client-admin'
     JOIN app_user u ON u.id = cm.user_id AND u.status = 'active'
     WHERE o.id = $1 AND o.lab_id = $2
     ORDER BY u.email`,
    [sample.orderId, labId],
  );
  for (const a of admins) {
    await enqueueEmail(manager, {
      labId,
      to: a.email,
      subject: `Sample ${sample.code} was not accepted for testing`,
      text: [
        `Dear ${a.display_name},`,
        '',
        `${a.lab_name} received sample ${sample.code} (${a.product_name}) for ${a.client_name} but could not accept it for testing.`,
        '',
        `Reason: ${body.reason}`,
        '',
        'No test will be run on this sample. Reply to this message or contact the lab to arrange a replacement.',
      ].join('\n'),
    });
  }
  await recordAudit(manager, {
    labId,
    actorUserId: auth.userId,
    action: 'sample.rejected',
    subjectType: 'sample',
    subjectId: sampleId,
    details: { code: sample.code, reason: body.reason, notified: admins.map((a) => a.email) },
  });
  return { notified: admins.map((a) => a.email) };
}
