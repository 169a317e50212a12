import type { EntityManager } from 'typeorm';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import type { ClientScope } from './client-views';
import { labelPhotoKind, type UploadedPhoto } from './product-service';

/** Stores the client's photo of one of its ordered samples while the sample has not reached the lab. */
export async function saveSamplePhoto(manager: EntityManager, auth: AuthContext, scope: ClientScope, orderId: string, sampleId: string,
  photo: UploadedPhoto | undefined): Promise<void> {
  if (!photo) throw ApiError.badRequest('Send a PNG or JPEG image in the "photo" field.', [{ field: 'photo', message: 'is required' }]);
  const contentType = labelPhotoKind(photo, 'photo');
  const [sample] = await manager.query(
    `SELECT s.id, s.code, s.state FROM sample s JOIN test_order o ON o.id = s.order_id AND o.lab_id = s.lab_id
     WHERE s.id = $1 AND o.id = $2 AND o.lab_id = $3 AND o.client_organisation_id = $4 FOR UPDATE OF s`,
    [sampleId, orderId, scope.labId, scope.clientOrganisationId],
  );
  if (!sample) throw ApiError.notFound('Sample');
  if (sample.state !== 'awaiting-arrival') throw ApiError.conflict(`The lab has already received ${sample.code}; its photo can no longer change.`);
  await manager.query(
    `INSERT INTO sample_client_photo (sample_id, lab_id, file_name, content_type, size_bytes, content) VALUES ($1, $2, $3, $4, $5, $6)
     ON CONFLICT (sample_id) DO UPDATE SET file_name = EXCLUDED.file_name, content_type = EXCLUDED.content_type,
       size_bytes = EXCLUDED.size_bytes, content = EXCLUDED.content, uploaded_at = now()`,
    [sampleId, scope.labId, photo.originalname.slice(0, 200), contentType, photo.size, await photo.content()],
  );
  await recordAudit(manager, { labId: scope.labId, actorUserId: auth.userId, action: 'sample.client-photo', subjectType: 'sample', subjectId: sampleId,
    details: { code: sample.code } });
}

export async function samplePhoto(manager: EntityManager, scope: ClientScope, orderId: string, sampleId: string): Promise<{ contentType: string; fileName: string; content: Buffer }> {
  const [row] = await manager.query(
    `SELECT ph.content_type, ph.file_name, ph.content FROM sample_client_photo ph
     JOIN sample s ON s.id = ph.sample_id JOIN test_order o ON o.id = s.order_id AND o.lab_id = s.lab_id
     WHERE s.id = $1 AND o.id = $2 AND o.lab_id = $3 AND o.client_organisation_id = $4`,
    [sampleId, orderId, scope.labId, scope.clientOrganisationId],
  );
  if (!row) throw ApiError.notFound('Sample photo');
  return { contentType: row.content_type, fileName: row.file_name, content: row.content };
}
