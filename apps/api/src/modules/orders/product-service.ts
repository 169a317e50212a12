import type { EntityManager } from 'typeorm';
import type { ProductInput, ProductSummary } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { imageKind } from '../intake/image-kind';
import type { UploadedImage } from '../intake/intake-service';
import { clientProduct, type ClientScope } from './client-views';

/** Label photos: PNG or JPEG (what a phone or scanner gives), at most 5 MB. */
export const LABEL_PHOTO_MAX_BYTES = 5 * 1048576;

/** A label photo as multer wrote it to disk (`imageOnDisk`): its first bytes now, the whole file just before its row is written. */
export type UploadedPhoto = UploadedImage;

/** The photo's format from its first bytes; anything but PNG or JPEG is refused by name. */
export function labelPhotoKind(file: UploadedPhoto, field: string): 'image/png' | 'image/jpeg' {
  const kind = imageKind(file.head);
  if (kind !== 'image/png' && kind !== 'image/jpeg') {
    throw new ApiError(415, 'Not a PNG or JPEG image', `${file.originalname} is not a PNG or JPEG image. Nothing was saved.`, {
      type: 'unsupported-image',
      errors: [{ field, message: 'must be a PNG or JPEG image' }],
    });
  }
  return kind;
}

function duplicateName(err: unknown): boolean {
  return (err as { code?: string; constraint?: string }).code === '23505' && (err as { constraint?: string }).constraint === 'product_name_key';
}

async function savePhoto(manager: EntityManager, scope: ClientScope, productId: string, photo: UploadedPhoto): Promise<void> {
  const contentType = labelPhotoKind(photo, 'photo');
  await manager.query(
    `INSERT INTO product_photo (product_id, lab_id, file_name, content_type, size_bytes, content)
     VALUES ($1, $2, $3, $4, $5, $6)
     ON CONFLICT (product_id) DO UPDATE SET file_name = EXCLUDED.file_name, content_type = EXCLUDED.content_type,
       size_bytes = EXCLUDED.size_bytes, content = EXCLUDED.content, uploaded_at = now()`,
    [productId, scope.labId, photo.originalname.slice(0, 200), contentType, photo.size, await photo.content()],
  );
}

/** Registers a product for the organisation; a second product of the same name answers 409. */
export async function createProduct(manager: EntityManager, auth: AuthContext, scope: ClientScope, input: ProductInput,
  photo: UploadedPhoto | undefined): Promise<ProductSummary> {
  if (photo) labelPhotoKind(photo, 'photo');
  let id: string;
  try {
    await manager.query('SAVEPOINT product_insert');
    const [row] = await manager.query(
      `INSERT INTO product (lab_id, client_organisation_id, name, matrix, description) VALUES ($1, $2, $3, $4, $5) RETURNING id`,
      [scope.labId, scope.clientOrganisationId, input.name, input.matrix, input.description],
    );
    id = row.id;
  } catch (err) {
    if (duplicateName(err)) {
      await manager.query('ROLLBACK TO SAVEPOINT product_insert');
      throw ApiError.conflict(`A product named “${input.name}” already exists.`, [{ field: 'name', message: 'is already used by another product' }]);
    }
    throw err;
  }
  if (photo) await savePhoto(manager, scope, id, photo);
  await recordAudit(manager, { labId: scope.labId, actorUserId: auth.userId, action: 'product.created', subjectType: 'product', subjectId: id,
    details: { name: input.name, matrix: input.matrix } });
  return clientProduct(manager, scope, id);
}

/** Edits a product's name, matrix and description, and replaces its photo when one is sent. */
export async function updateProduct(manager: EntityManager, auth: AuthContext, scope: ClientScope, id: string, input: ProductInput,
  photo: UploadedPhoto | undefined): Promise<ProductSummary> {
  if (photo) labelPhotoKind(photo, 'photo');
  const [found] = await manager.query('SELECT id FROM product WHERE id = $1 AND lab_id = $2 AND client_organisation_id = $3 FOR UPDATE',
    [id, scope.labId, scope.clientOrganisationId]);
  if (!found) throw ApiError.notFound('Product');
  try {
    await manager.query('SAVEPOINT product_update');
    await manager.query('UPDATE product SET name = $2, matrix = $3, description = $4, updated_at = now() WHERE id = $1',
      [id, input.name, input.matrix, input.description]);
  } catch (err) {
    if (duplicateName(err)) {
      await manager.query('ROLLBACK TO SAVEPOINT product_update');
      throw ApiError.conflict(`A product named “${input.name}” already exists.`, [{ field: 'name', message: 'is already used by another product' }]);
    }
    throw err;
  }
  if (photo) await savePhoto(manager, scope, id, photo);
  await recordAudit(manager, { labId: scope.labId, actorUserId: auth.userId, action: 'product.updated', subjectType: 'product', subjectId: id,
    details: { name: input.name, matrix: input.matrix, photoReplaced: Boolean(photo) } });
  return clientProduct(manager, scope, id);
}

/** The product's label photo, only for its own organisation. */
export async function productPhoto(manager: EntityManager, scope: ClientScope, id: string): Promise<{ contentType: string; fileName: string; content: Buffer }> {
  const [row] = await manager.query(
    `SELECT ph.content_type, ph.file_name, ph.content FROM product_photo ph JOIN product p ON p.id = ph.product_id
     WHERE p.id = $1 AND p.lab_id = $2 AND p.client_organisation_id = $3`,
    [id, scope.labId, scope.clientOrganisationId],
  );
  if (!row) throw ApiError.notFound('Label photo');
  return { contentType: row.content_type, fileName: row.file_name, content: row.content };
}
