import type { EntityManager } from 'typeorm';
import type { ClientOrderListQuery, OrderSummary, Page, ProductListQuery, ProductSummary } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, sparseSearchIds, pageParams, toCappedPage, totalCapFor } from '../../core/paging';

/** Whose data a client user sees: their organisation, inside their lab. */
export interface ClientScope {
  labId: string;
  clientOrganisationId: string;
}

interface OrderRow {
  id: string;
  status: OrderSummary['status'];
  placed_at: Date;
  credits_reserved: number;
  product_id: string;
  product_name: string;
  matrix: OrderSummary['product']['matrix'];
  client_id: string;
  client_name: string;
  placed_by_id: string;
  placed_by_name: string;
  kind: OrderSummary['kind'];
  carrier: string;
  tracking_number: string;
  shipped_at: Date | null;
  cancelled_at: Date | null;
  samples: (Omit<OrderSummary['samples'][number], 'description'> & { obtainedWhere: string; obtainedOn: string; labelText: string; claimedLot: string })[];
}

const ORDER_SQL = `
  SELECT o.id, o.status, o.placed_at, o.credits_reserved, o.kind, o.carrier, o.tracking_number, o.shipped_at, o.cancelled_at,
         p.id AS product_id, p.name AS product_name, p.matrix,
         co.id AS client_id, co.name AS client_name, u.id AS placed_by_id, u.display_name AS placed_by_name,
         COALESCE((SELECT json_agg(json_build_object('id', s.id, 'code', s.code, 'state', s.state,
                    'obtainedWhere', s.obtained_where, 'obtainedOn', to_char(s.obtained_on, 'YYYY-MM-DD'),
                    'labelText', s.label_text, 'claimedLot', s.claimed_lot, 'kind', s.kind, 'referenceLot', s.reference_lot,
                    'container', s.container, 'notes', s.client_notes, 'credits', s.credits, 'creditState', s.credit_state,
                    'hasPhoto', EXISTS (SELECT 1 FROM sample_client_photo ph WHERE ph.sample_id = s.id),
                    'rejectionReason', s.rejection_reason,
                    'receivedAt', to_char(s.received_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'),
                    'updatedAt', to_char(s.state_changed_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')) ORDER BY s.code)
                   FROM sample s WHERE s.order_id = o.id AND s.lab_id = o.lab_id), '[]'::json) AS samples
  FROM test_order o
  JOIN product p ON p.id = o.product_id AND p.lab_id = o.lab_id
  JOIN client_organisation co ON co.id = o.client_organisation_id AND co.lab_id = o.lab_id
  JOIN app_user u ON u.id = o.placed_by_user_id`;

function orderView(r: OrderRow): OrderSummary {
  return {
    id: r.id,
    product: { id: r.product_id, name: r.product_name, matrix: r.matrix },
    clientOrganisation: { id: r.client_id, name: r.client_name },
    status: r.status,
    placedBy: { id: r.placed_by_id, displayName: r.placed_by_name },
    placedAt: r.placed_at.toISOString(),
    creditsReserved: r.credits_reserved,
    kind: r.kind,
    shipment: r.shipped_at ? { carrier: r.carrier, trackingNumber: r.tracking_number, shippedAt: r.shipped_at.toISOString() } : null,
    cancelledAt: r.cancelled_at?.toISOString() ?? null,
    samples: r.samples.map(({ obtainedWhere, obtainedOn, labelText, claimedLot, ...s }) => ({
      ...s,
      description: { obtainedWhere, obtainedOn, labelText, claimedLot },
    })),
  };
}

const ORDER_SORT: Record<ClientOrderListQuery['sort'], string> = { placedAt: 'o.placed_at', status: 'o.status', product: 'lower(p.name)' };

/** The organisation's orders with their samples and states. */
export async function clientOrders(manager: EntityManager, scope: ClientScope, query: ClientOrderListQuery): Promise<Page<OrderSummary>> {
  const params: unknown[] = [scope.labId, scope.clientOrganisationId];
  const where = ['o.lab_id = $1', 'o.client_organisation_id = $2'];
  if (query.status) {
    params.push(query.status);
    where.push(`o.status = $${params.length}`);
  }
  if (query.kind) {
    params.push(query.kind);
    where.push(`o.kind = $${params.length}`);
  }
  if (query.q) {
    params.push(escapeLike(query.q));
    const p = `$${params.length}`;
    // each alternative on its own table's index (trigram for the sample's texts)
    const products = `SELECT p2.id FROM product p2 WHERE p2.lab_id = $1 AND p2.client_organisation_id = $2 AND p2.name ILIKE ${p}`;
    const arms = [
      `SELECT x.id FROM test_order x WHERE x.lab_id = $1 AND x.client_organisation_id = $2 AND x.product_id IN (${products})`,
      `SELECT s.order_id FROM sample s WHERE s.lab_id = $1 AND s.code ILIKE ${p}`,
      `SELECT s.order_id FROM sample s WHERE s.lab_id = $1 AND s.claimed_lot ILIKE ${p}`,
      `SELECT s.order_id FROM sample s WHERE s.lab_id = $1 AND s.label_text ILIKE ${p}`,
    ];
    const ids = await sparseSearchIds(manager, arms, params);
    if (ids) params[params.length - 1] = ids;
    where.push(ids
      ? `o.id = ANY(${p}::uuid[])`
      : `(o.product_id IN (${products}) OR EXISTS (SELECT 1 FROM sample s WHERE s.order_id = o.id AND s.lab_id = $1
           AND (s.code ILIKE ${p} OR s.claimed_lot ILIKE ${p} OR s.label_text ILIKE ${p})))`);
  }
  const { skip, take } = pageParams(query);
  const order = `${ORDER_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, o.id`;
  const byProduct = query.sort === 'product';
  // the page is chosen on test_order alone (an index walks the order), then joined and its samples gathered
  const [rows, counted] = await Promise.all([
    manager.query(
      `${ORDER_SQL.replace('FROM test_order o', `FROM (SELECT o.* FROM test_order o JOIN (SELECT o.id FROM test_order o ${byProduct ? 'JOIN product p ON p.id = o.product_id' : ''} WHERE ${where.join(' AND ')}
         ORDER BY ${order} LIMIT $${params.length + 1} OFFSET $${params.length + 2}) page USING (id)) o`)}
       ORDER BY ${order}`,
      [...params, take, skip],
    ) as Promise<OrderRow[]>,
    cappedCount(manager, `FROM test_order o WHERE ${where.join(' AND ')}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(orderView), counted, query);
}

export async function clientOrder(manager: EntityManager, scope: ClientScope, orderId: string): Promise<OrderSummary> {
  const rows: OrderRow[] = await manager.query(`${ORDER_SQL} WHERE o.lab_id = $1 AND o.client_organisation_id = $2 AND o.id = $3`, [scope.labId, scope.clientOrganisationId, orderId]);
  if (!rows.length) throw ApiError.notFound('Order');
  return orderView(rows[0]);
}

const PRODUCT_SORT: Record<ProductListQuery['sort'], string> = { name: 'lower(p.name)', matrix: 'p.matrix' };

interface ProductRow {
  id: string;
  name: string;
  matrix: ProductSummary['matrix'];
  description: string;
  client_id: string;
  client_name: string;
  version_id: string | null;
  version: number | null;
  lot_count: number | null;
  building: boolean;
  has_photo: boolean;
}

// A library is being built once it exists (a draft version) or lots were sent for enrolment.
const PRODUCT_SQL = `
  SELECT p.id, p.name, p.matrix, p.description, co.id AS client_id, co.name AS client_name,
         v.id AS version_id, v.version, (SELECT count(*)::int FROM reference_lot r WHERE r.library_version_id = v.id) AS lot_count,
         (EXISTS (SELECT 1 FROM reference_library l WHERE l.product_id = p.id AND l.lab_id = p.lab_id)
          OR EXISTS (SELECT 1 FROM test_order o WHERE o.product_id = p.id AND o.lab_id = p.lab_id
                     AND o.kind = 'reference-enrolment' AND o.status <> 'cancelled')) AS building,
         EXISTS (SELECT 1 FROM product_photo ph WHERE ph.product_id = p.id) AS has_photo
  FROM product p
  JOIN client_organisation co ON co.id = p.client_organisation_id AND co.lab_id = p.lab_id
  LEFT JOIN LATERAL (
    SELECT v.id, v.version FROM library_version v JOIN reference_library l ON l.id = v.library_id
    WHERE l.product_id = p.id AND v.lab_id = p.lab_id AND v.status = 'published' ORDER BY v.version DESC LIMIT 1
  ) v ON true`;

function productView(r: ProductRow): ProductSummary {
  return {
    id: r.id,
    name: r.name,
    matrix: r.matrix,
    description: r.description,
    clientOrganisation: { id: r.client_id, name: r.client_name },
    publishedLibraryVersion: r.version_id ? { id: r.version_id, version: r.version as number, lotCount: r.lot_count ?? 0 } : null,
    libraryState: r.version_id ? 'published' : r.building ? 'building' : 'none',
    hasPhoto: r.has_photo,
  };
}

/** The organisation's products, each with its newest published library version. */
export async function clientProducts(manager: EntityManager, scope: ClientScope, query: ProductListQuery): Promise<Page<ProductSummary>> {
  const params: unknown[] = [scope.labId, scope.clientOrganisationId];
  let search = '';
  if (query.q) {
    params.push(escapeLike(query.q));
    search = 'AND (p.name ILIKE $3 OR p.description ILIKE $3)';
  }
  const { skip, take } = pageParams(query);
  const [rows, counted] = await Promise.all([
    manager.query(
      `${PRODUCT_SQL}
       WHERE p.lab_id = $1 AND p.client_organisation_id = $2 ${search}
       ORDER BY ${PRODUCT_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, p.id
       LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, take, skip],
    ) as Promise<ProductRow[]>,
    cappedCount(manager, `FROM product p WHERE p.lab_id = $1 AND p.client_organisation_id = $2 ${search}`, params, totalCapFor(query)),
  ]);
  return toCappedPage(rows.map(productView), counted, query);
}

/** One of the organisation's products; another organisation's answers 404. */
export async function clientProduct(manager: EntityManager, scope: ClientScope, productId: string): Promise<ProductSummary> {
  const rows: ProductRow[] = await manager.query(`${PRODUCT_SQL} WHERE p.lab_id = $1 AND p.client_organisation_id = $2 AND p.id = $3`,
    [scope.labId, scope.clientOrganisationId, productId]);
  if (!rows.length) throw ApiError.notFound('Product');
  return productView(rows[0]);
}
