import type { EntityManager } from 'typeorm';
import type { AcceptSample, IntakePhoto as IntakePhotoView, RecordArrival, RejectSample } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { appendCustody } from '../custody/append-custody';
import { notifyClientOrganisation } from '../notifications/notify-client-organisation';
import { refreshOrderStatus } from '../orders/order-progress';
import { consumeSampleCredits, releaseSampleCredits } from '../orders/sample-credits';
import { findLabSample, moveSample, requireSampleState } from '../samples/sample-access';
import { sampleDetail, samplePhotos } from '../samples/sample-views';
import { imageKind } from './image-kind';
import { IntakePhoto } from './intake-photo.entity';
import { SampleIntake } from './sample-intake.entity';

const INTAKE_BENCH = 'Intake bench';

/** Records the parcel on arrival: awaiting-arrival → received, and the first custody link. */
export async function recordArrival(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, arrival: RecordArrival): Promise<void> {
  // The order first, as cancelling does, so an arrival and a cancellation cannot cross.
  const [placed] = await manager.query(
    'SELECT o.status FROM test_order o JOIN sample s ON s.order_id = o.id AND s.lab_id = o.lab_id WHERE s.id = $1 AND s.lab_id = $2 FOR UPDATE OF o',
    [sampleId, labId],
  );
  if (placed?.status === 'cancelled') throw ApiError.conflict('The client cancelled this order; its samples are not to be received for testing.');
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
  const order = await orderFacts(manager, labId, sample.orderId);
  await notifyClientOrganisation(manager, {
    labId,
    clientOrganisationId: order.clientOrganisationId,
    event: 'sample-received',
    subject: `Sample ${sample.code} has arrived at ${order.labName}`,
    text: [
      `${order.labName} received sample ${sample.code} (${order.productName}) for ${order.clientName} on ${arrivedAt.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })}.`,
      'The lab checks its condition next; you will hear again when it is accepted for testing or if it cannot be.',
    ].join('\n\n'),
    link: `/orders/${sample.orderId}`,
  });
}

/** Who ordered the sample and what, for the client's notifications. */
async function orderFacts(manager: EntityManager, labId: string, orderId: string): Promise<{ clientOrganisationId: string; clientName: string; productName: string; labName: string }> {
  const [row] = await manager.query(
    `SELECT o.client_organisation_id, co.name AS client_name, p.name AS product_name, l.name AS lab_name
       FROM test_order o
       JOIN client_organisation co ON co.id = o.client_organisation_id AND co.lab_id = o.lab_id
       JOIN product p ON p.id = o.product_id
       JOIN lab l ON l.id = o.lab_id
      WHERE o.id = $1 AND o.lab_id = $2`,
    [orderId, labId],
  );
  return { clientOrganisationId: row.client_organisation_id, clientName: row.client_name, productName: row.product_name, labName: row.lab_name };
}

export interface UploadedImage {
  originalname: string;
  size: number;
  /** The file's first bytes (enough to tell its kind). */
  head: Buffer;
  /** The whole file, read when its row is written (one photo in memory at a time). */
  content(): Promise<Buffer>;
}

/** Stores intake photos; a file that is not a JPEG, PNG or WebP image is refused by name. */
export async function addPhotos(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, files: UploadedImage[]): Promise<IntakePhotoView[]> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  requireSampleState(sample, ['received', 'accepted', 'rejected'], 'adding intake photos');
  if (!files.length) throw ApiError.badRequest('Send one or more images in the "photos" field.', [{ field: 'photos', message: 'is required' }]);
  const kinds = files.map((f) => imageKind(f.head));
  const bad = files.filter((_, i) => kinds[i] === null).map((f) => f.originalname);
  if (bad.length) {
    throw ApiError.badRequest(
      `Not a JPEG, PNG or WebP image: ${bad.join(', ')}. Nothing was saved.`,
      bad.map((name) => ({ field: `photos[${name}]`, message: 'is not a JPEG, PNG or WebP image' })),
    );
  }
  const now = new Date();
  for (const [i, f] of files.entries()) {
    await manager.insert(IntakePhoto, { labId, sampleId, fileName: f.originalname, contentType: kinds[i] as string, sizeBytes: f.size, content: await f.content(), uploadedByUserId: auth.userId, uploadedAt: now });
  }
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
  // An enrolled reference lot is paid for once the lab takes it in; it never gets a report of its own.
  if (sample.kind === 'reference-lot') await consumeSampleCredits(manager, labId, sampleId, 'Reference lot accepted for enrolment', auth.userId);
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'sample.accepted', subjectType: 'sample', subjectId: sampleId, details: { code: sample.code, storageLocation: body.storageLocation,
    ...(warnings.length ? { warnings: warnings.map((w) => w.message), overrideReason: body.overrideReason } : {}) } });
}

/** received → rejected; every client admin of the ordering organisation is told why. */
export async function rejectSample(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, body: RejectSample): Promise<{ notified: string[] }> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  requireSampleState(sample, ['received'], 'rejecting it');
  await moveSample(manager, sample, 'rejected', { rejectionReason: body.reason });
  await releaseSampleCredits(manager, labId, sampleId, 'Sample rejected at intake', auth.userId);
  await refreshOrderStatus(manager, labId, sample.orderId);
  await appendCustody(manager, { labId, sampleId, kind: 'rejected', location: INTAKE_BENCH, reason: body.reason, actorUserId: auth.userId });
  const order = await orderFacts(manager, labId, sample.orderId);
  const { emailed } = await notifyClientOrganisation(manager, {
    labId,
    clientOrganisationId: order.clientOrganisationId,
    event: 'sample-rejected',
    subject: `Sample ${sample.code} was not accepted for testing`,
    text: [
      `${order.labName} received sample ${sample.code} (${order.productName}) for ${order.clientName} but could not accept it for testing.`,
      `Reason: ${body.reason}`,
      `No test will be run on this sample, and the credits held for it are back in your balance. Contact ${order.labName} to arrange a replacement.`,
    ].join('\n\n'),
    link: `/orders/${sample.orderId}`,
  });
  await recordAudit(manager, {
    labId,
    actorUserId: auth.userId,
    action: 'sample.rejected',
    subjectType: 'sample',
    subjectId: sampleId,
    details: { code: sample.code, reason: body.reason, notified: emailed },
  });
  return { notified: emailed };
}
