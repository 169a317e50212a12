import type { EntityManager } from 'typeorm';
import type { NewCheckOrder, NewReferenceOrder, OrderShipment, OrderSummary, ReferenceLotDeclaration } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { reserveCredits } from '../credits/credit-ledger';
import { newSampleCode } from '../samples/sample-code';
import { clientOrder, type ClientScope } from './client-views';
import { notifyClientOrderPlaced } from './order-notice';
import { releaseSampleCredits } from './sample-credits';

interface NewSampleRow {
  obtainedWhere: string;
  obtainedOn: string;
  labelText: string;
  claimedLot: string;
  container: string;
  notes: string;
  referenceLot: ReferenceLotDeclaration | null;
}

interface OrderedProduct {
  id: string;
  name: string;
  published: boolean;
}

async function ownProduct(manager: EntityManager, scope: ClientScope, productId: string): Promise<OrderedProduct> {
  const [row] = await manager.query(
    `SELECT p.id, p.name, EXISTS (
       SELECT 1 FROM library_version v JOIN reference_library l ON l.id = v.library_id
       WHERE l.product_id = p.id AND v.lab_id = p.lab_id AND v.status = 'published') AS published
     FROM product p WHERE p.id = $1 AND p.lab_id = $2 AND p.client_organisation_id = $3`,
    [productId, scope.labId, scope.clientOrganisationId],
  );
  if (!row) throw new ApiError(404, 'Not found', 'Product was not found.', { type: 'not-found', errors: [{ field: 'productId', message: 'is not one of your products' }] });
  return row;
}

/** Inserts a sample under a fresh lab-unique code; a code already taken is drawn again. */
async function insertSample(manager: EntityManager, labId: string, orderId: string, s: NewSampleRow, credits: number): Promise<string> {
  for (let attempt = 0; attempt < 5; attempt++) {
    // TypeORM answers an INSERT … RETURNING with the rows (an UPDATE with [rows, affected]).
    const rows: { id: string }[] = await manager.query(
      `INSERT INTO sample (lab_id, order_id, code, kind, reference_lot, obtained_where, obtained_on, label_text, claimed_lot,
                           container, client_notes, credits, credit_state, state_changed_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, now())
       ON CONFLICT (code) DO NOTHING RETURNING id`,
      [labId, orderId, newSampleCode(), s.referenceLot ? 'reference-lot' : 'check', s.referenceLot, s.obtainedWhere, s.obtainedOn,
        s.labelText, s.claimedLot, s.container, s.notes, credits, credits > 0 ? 'reserved' : 'none'],
    );
    if (rows.length) return rows[0].id;
  }
  throw new Error('could not draw an unused sample code in five attempts');
}

/**
 * Creates the order, its samples and their credit reservations in the caller's transaction. The
 * account row is locked first, so concurrent orders queue; an order the balance cannot cover is
 * refused as a whole by the ledger (409 naming the shortfall) and nothing is kept.
 */
async function placeOrder(manager: EntityManager, auth: AuthContext, scope: ClientScope, product: OrderedProduct,
  kind: OrderSummary['kind'], samples: NewSampleRow[], price: number): Promise<OrderSummary> {
  const total = price * samples.length;
  if (total > 0) {
    const [account] = await manager.query(
      'SELECT available FROM credit_account WHERE lab_id = $1 AND client_organisation_id = $2 FOR UPDATE',
      [scope.labId, scope.clientOrganisationId],
    );
    // The ledger core words the refusal (needed, available, shortfall) for the whole order.
    if (!account || account.available < total) await reserveCredits(manager, scope, total, { reason: 'Order refused', actorUserId: auth.userId });
  }
  const [order] = await manager.query(
    `INSERT INTO test_order (lab_id, client_organisation_id, product_id, kind, placed_by_user_id, credits_reserved, placed_at)
     VALUES ($1, $2, $3, $4, $5, $6, now()) RETURNING id`,
    [scope.labId, scope.clientOrganisationId, product.id, kind, auth.userId, total],
  );
  const what = kind === 'check' ? 'Check of' : 'Reference lot of';
  const ids: string[] = [];
  for (const s of samples) {
    const sampleId = await insertSample(manager, scope.labId, order.id, s, price);
    ids.push(sampleId);
    if (price > 0) {
      await reserveCredits(manager, scope, price, { reason: `${what} ${product.name} ordered`, actorUserId: auth.userId, orderId: order.id, sampleId });
    }
  }
  const stored = await clientOrder(manager, scope, order.id);
  // In the order they were sent, so a client can match each answer to what it typed (photos, say).
  const placed = { ...stored, samples: ids.map((id) => stored.samples.find((s) => s.id === id) as OrderSummary['samples'][number]) };
  await recordAudit(manager, { labId: scope.labId, actorUserId: auth.userId, action: 'order.placed', subjectType: 'order', subjectId: order.id,
    details: { kind, product: product.name, samples: placed.samples.map((s) => s.code), credits: total } });
  await notifyClientOrderPlaced(manager, scope, placed);
  return placed;
}

async function prices(manager: EntityManager, labId: string): Promise<{ check: number; lot: number }> {
  const [lab] = await manager.query('SELECT credits_per_check_sample, credits_per_reference_lot FROM lab WHERE id = $1', [labId]);
  return { check: lab.credits_per_check_sample, lot: lab.credits_per_reference_lot };
}

/** Checks of suspect samples; only a product with a published reference library can be checked. */
export async function placeCheckOrder(manager: EntityManager, auth: AuthContext, scope: ClientScope, body: NewCheckOrder): Promise<OrderSummary> {
  const product = await ownProduct(manager, scope, body.productId);
  if (!product.published) {
    throw new ApiError(409, 'No published reference library', `${product.name} has no published reference library yet, so a check cannot ` +
      'be scored against it. Enrol authentic reference lots first; the lab publishes the library once it holds enough of them.', {
      type: 'no-published-library',
      errors: [{ field: 'productId', message: 'has no published reference library yet' }],
    });
  }
  const samples = body.samples.map((s) => ({ ...s, claimedLot: s.lotClaimed, referenceLot: null }));
  return placeOrder(manager, auth, scope, product, 'check', samples, (await prices(manager, scope.labId)).check);
}

/** Authentic lots to enrol in the product's reference library; they arrive at intake as samples. */
export async function placeReferenceOrder(manager: EntityManager, auth: AuthContext, scope: ClientScope, body: NewReferenceOrder): Promise<OrderSummary> {
  const product = await ownProduct(manager, scope, body.productId);
  const samples = body.lots.map((lot) => ({
    obtainedWhere: 'Producer (authentic reference lot)',
    obtainedOn: lot.producedOn,
    labelText: '',
    claimedLot: lot.lotCode,
    container: '',
    notes: lot.notes,
    referenceLot: { lotCode: lot.lotCode, producedOn: lot.producedOn, volumeMl: lot.volumeMl, chemistry: lot.chemistry },
  }));
  return placeOrder(manager, auth, scope, product, 'reference-enrolment', samples, (await prices(manager, scope.labId)).lot);
}

async function lockedOrder(manager: EntityManager, scope: ClientScope, orderId: string): Promise<{ id: string; status: string }> {
  const [order] = await manager.query(
    'SELECT id, status FROM test_order WHERE id = $1 AND lab_id = $2 AND client_organisation_id = $3 FOR UPDATE',
    [orderId, scope.labId, scope.clientOrganisationId],
  );
  if (!order) throw ApiError.notFound('Order');
  return order;
}

/** Cancels an order none of whose samples has reached the lab, and gives every held credit back. */
export async function cancelOrder(manager: EntityManager, auth: AuthContext, scope: ClientScope, orderId: string): Promise<OrderSummary> {
  const order = await lockedOrder(manager, scope, orderId);
  if (order.status === 'cancelled') throw ApiError.conflict('This order is already cancelled.');
  const samples: { id: string; code: string; state: string }[] = await manager.query(
    'SELECT id, code, state FROM sample WHERE order_id = $1 AND lab_id = $2 ORDER BY code FOR UPDATE', [orderId, scope.labId]);
  const arrived = samples.filter((s) => s.state !== 'awaiting-arrival');
  if (arrived.length) {
    throw new ApiError(409, 'Samples already received', `The lab has already received ${arrived.map((s) => s.code).join(', ')}, so this ` +
      'order can no longer be cancelled. Contact the lab if the samples should not be tested.', { type: 'order-received' });
  }
  let released = 0;
  for (const s of samples) released += await releaseSampleCredits(manager, scope.labId, s.id, 'Order cancelled', auth.userId);
  await manager.query(`UPDATE test_order SET status = 'cancelled', cancelled_at = now(), updated_at = now() WHERE id = $1`, [orderId]);
  await recordAudit(manager, { labId: scope.labId, actorUserId: auth.userId, action: 'order.cancelled', subjectType: 'order', subjectId: orderId,
    details: { samples: samples.map((s) => s.code), creditsReleased: released } });
  return clientOrder(manager, scope, orderId);
}

/** Records (or corrects) how the parcel travels; the lab's intake sees it. */
export async function recordShipment(manager: EntityManager, auth: AuthContext, scope: ClientScope, orderId: string, body: OrderShipment): Promise<OrderSummary> {
  const order = await lockedOrder(manager, scope, orderId);
  if (order.status === 'cancelled') throw ApiError.conflict('This order is cancelled; there is nothing to ship.');
  if (order.status !== 'placed') throw ApiError.conflict('The lab has already received samples of this order; the shipment can no longer be changed.');
  await manager.query(
    'UPDATE test_order SET carrier = $2, tracking_number = $3, shipped_at = COALESCE(shipped_at, now()), updated_at = now() WHERE id = $1',
    [orderId, body.carrier, body.trackingNumber],
  );
  await recordAudit(manager, { labId: scope.labId, actorUserId: auth.userId, action: 'order.shipped', subjectType: 'order', subjectId: orderId,
    details: { carrier: body.carrier, trackingNumber: body.trackingNumber } });
  return clientOrder(manager, scope, orderId);
}
