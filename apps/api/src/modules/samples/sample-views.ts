import type { EntityManager } from 'typeorm';
import type { IntakeLimit, IntakePhoto, Page, SampleDetail, WorkQueueItem, WorkQueueQuery } from '@ohmprint/contracts';
import { intakeWarnings, limitsFrom } from '../intake/intake-guardrails';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, sparseSearchIds, pageParams, toCappedPage, totalCapFor } from '../../core/paging';
import { sampleTiming } from './sample-timing';
import { revokedReportOf } from '../analyses/revoked-report';

interface QueueRow {
  id: string;
  code: string;
  state: WorkQueueItem['state'];
  product_name: string;
  matrix: WorkQueueItem['matrix'];
  client_name: string;
  placed_at: Date;
  received_at: Date | null;
  turnaround_days: number;
}

const QUEUE_SORT: Record<WorkQueueQuery['sort'], string> = {
  // Oldest first is "age descending", i.e. the clock's start ascending. `sample.placed_at` is
  // the order's, copied by a trigger, so this order has an index of its own.
  age: 'COALESCE(s.received_at, s.placed_at)',
  // The turnaround target is the lab's, so the due date orders as the clock's start does.
  due: 'COALESCE(s.received_at, s.placed_at)',
  code: 's.code',
  state: 's.state',
  product: 'lower(p.name)',
  client: 'lower(co.name)',
};

/**
 * The lab's work queue: samples by state, with age against the turnaround target. The page is
 * chosen on the sample table alone (its index walks the order), then joined for names; the
 * total is counted up to the cap.
 */
export async function workQueue(manager: EntityManager, labId: string, query: WorkQueueQuery): Promise<Page<WorkQueueItem>> {
  const params: unknown[] = [labId];
  // A cancelled order's samples will never come: they are no one's work. Only a sample still
  // awaiting arrival can belong to a cancelled order, so only those look at their order.
  const where = ['s.lab_id = $1', `NOT (s.state = 'awaiting-arrival' AND s.order_id IN (SELECT x.id FROM test_order x WHERE x.lab_id = $1 AND x.status = 'cancelled'))`];
  if (query.state.length) {
    params.push(query.state);
    where.push(`s.state = ANY($${params.length}::text[])`);
  }
  const joined = query.sort === 'product' || query.sort === 'client';
  if (query.q) {
    params.push(escapeLike(query.q));
    const p = `$${params.length}`;
    // one arm per column, each on its own index (trigram for the sample's texts): an OR tested
    // on every sample would read the whole lab. The product and client are the sample's own
    // columns (copied from its order), so a broad search tests each sample row without a join.
    const products = `SELECT p2.id FROM product p2 WHERE p2.lab_id = $1 AND p2.name ILIKE ${p}`;
    const clients = `SELECT c2.id FROM client_organisation c2 WHERE c2.lab_id = $1 AND c2.name ILIKE ${p}`;
    const arms = [
      `SELECT x.id FROM sample x WHERE x.lab_id = $1 AND x.code ILIKE ${p}`,
      `SELECT x.id FROM sample x WHERE x.lab_id = $1 AND x.claimed_lot ILIKE ${p}`,
      `SELECT x.id FROM sample x WHERE x.lab_id = $1 AND x.product_id IN (${products})`,
      `SELECT x.id FROM sample x WHERE x.lab_id = $1 AND x.client_organisation_id IN (${clients})`,
    ];
    const ids = await sparseSearchIds(manager, arms, params);
    if (ids) params[params.length - 1] = ids;
    where.push(ids
      ? `s.id = ANY(${p}::uuid[])`
      : `(s.code ILIKE ${p} OR s.claimed_lot ILIKE ${p} OR s.product_id IN (${products}) OR s.client_organisation_id IN (${clients}))`);
  }
  // For age the user's direction is about age, the opposite of the timestamp's.
  const ascending = query.sort === 'age' ? query.dir === 'desc' : query.dir === 'asc';
  const order = `${QUEUE_SORT[query.sort]} ${ascending ? 'ASC' : 'DESC'}, s.code ASC`;
  const { skip, take } = pageParams(query);
  const counted = cappedCount(manager, `FROM sample s WHERE ${where.join(' AND ')}`, params, totalCapFor(query));
  const pageParamsAt = params.length;
  const rows: QueueRow[] = await manager.query(
    `SELECT s.id, s.code, s.state, p.name AS product_name, p.matrix, co.name AS client_name,
            o.placed_at, s.received_at, l.turnaround_target_days AS turnaround_days
     FROM (SELECT s.id, s.code, s.state, s.order_id, s.received_at, s.placed_at FROM sample s
           ${joined ? 'JOIN test_order o ON o.id = s.order_id JOIN product p ON p.id = o.product_id JOIN client_organisation co ON co.id = o.client_organisation_id' : ''}
           WHERE ${where.join(' AND ')}
           ORDER BY ${order} LIMIT $${pageParamsAt + 1} OFFSET $${pageParamsAt + 2}) s
     JOIN test_order o ON o.id = s.order_id AND o.lab_id = $1
     JOIN product p ON p.id = o.product_id AND p.lab_id = $1
     JOIN client_organisation co ON co.id = o.client_organisation_id AND co.lab_id = $1
     JOIN lab l ON l.id = $1
     ORDER BY ${order}`,
    [...params, take, skip],
  );
  const now = new Date();
  const items = rows.map(
    (r): WorkQueueItem => ({
      id: r.id,
      code: r.code,
      state: r.state,
      productName: r.product_name,
      matrix: r.matrix,
      clientOrganisationName: r.client_name,
      placedAt: r.placed_at.toISOString(),
      receivedAt: r.received_at?.toISOString() ?? null,
      turnaroundDays: r.turnaround_days,
      ...sampleTiming(r.placed_at, r.received_at, r.turnaround_days, now),
    }),
  );
  return toCappedPage(items, await counted, query);
}

interface DetailRow {
  id: string;
  code: string;
  state: SampleDetail['state'];
  obtained_where: string;
  obtained_on: string;
  label_text: string;
  claimed_lot: string;
  storage_location: string | null;
  rejection_reason: string | null;
  received_at: Date | null;
  order_id: string;
  placed_at: Date;
  placed_by_id: string;
  placed_by_name: string;
  credits_reserved: number;
  product_id: string;
  product_name: string;
  matrix: SampleDetail['product']['matrix'];
  client_id: string;
  client_name: string;
  turnaround_days: number;
  intake_limits: IntakeLimit[] | null;
  kind: SampleDetail['kind'];
  reference_lot: SampleDetail['referenceLot'];
  carrier: string;
  tracking_number: string;
  shipped_at: Date | null;
  intake: (Omit<NonNullable<SampleDetail['intake']>, 'recordedBy'> & { recordedById: string; recordedByName: string }) | null;
}

/** One query for the sample and its order, product, client and intake; one for its photos. */
export async function sampleDetail(manager: EntityManager, labId: string, where: { id: string } | { code: string }): Promise<SampleDetail> {
  const byCode = 'code' in where;
  const rows: DetailRow[] = await manager.query(
    `SELECT s.id, s.code, s.state, s.obtained_where, to_char(s.obtained_on, 'YYYY-MM-DD') AS obtained_on,
            s.label_text, s.claimed_lot, s.storage_location, s.rejection_reason, s.received_at,
            o.id AS order_id, o.placed_at, o.credits_reserved, pb.id AS placed_by_id, pb.display_name AS placed_by_name,
            p.id AS product_id, p.name AS product_name, p.matrix, co.id AS client_id, co.name AS client_name,
            l.turnaround_target_days AS turnaround_days, l.intake_limits, s.kind, s.reference_lot, o.carrier, o.tracking_number, o.shipped_at,
            CASE WHEN i.sample_id IS NULL THEN NULL ELSE json_build_object(
              'carrier', i.carrier, 'trackingNumber', i.tracking_number,
              'arrivedAt', to_char(i.arrived_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'),
              'temperatureC', i.temperature_c, 'sealIntact', i.seal_intact, 'containerCondition', i.container_condition,
              'volumeMl', i.volume_ml, 'notes', i.notes,
              'recordedAt', to_char(i.recorded_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'),
              'recordedById', rb.id, 'recordedByName', rb.display_name) END AS intake
     FROM sample s
     JOIN test_order o ON o.id = s.order_id AND o.lab_id = s.lab_id
     JOIN app_user pb ON pb.id = o.placed_by_user_id
     JOIN product p ON p.id = o.product_id AND p.lab_id = s.lab_id
     JOIN client_organisation co ON co.id = o.client_organisation_id AND co.lab_id = s.lab_id
     JOIN lab l ON l.id = s.lab_id
     LEFT JOIN sample_intake i ON i.sample_id = s.id AND i.lab_id = s.lab_id
     LEFT JOIN app_user rb ON rb.id = i.recorded_by_user_id
     WHERE s.lab_id = $1 AND ${byCode ? 's.code = $2' : 's.id = $2'}`,
    [labId, byCode ? where.code : where.id],
  );
  const r = rows[0];
  if (!r) throw ApiError.notFound(byCode ? `Sample ${where.code}` : 'Sample');
  const photos = await samplePhotos(manager, labId, r.id);
  const revoked = r.state === 'reported' ? await revokedReportOf(manager, labId, r.id) : null;
  const { recordedById, recordedByName, ...intake } = r.intake ?? ({} as NonNullable<DetailRow['intake']>);
  const timing = sampleTiming(r.placed_at, r.received_at, r.turnaround_days);
  return {
    id: r.id,
    code: r.code,
    state: r.state,
    description: { obtainedWhere: r.obtained_where, obtainedOn: r.obtained_on, labelText: r.label_text, claimedLot: r.claimed_lot },
    order: {
      id: r.order_id,
      placedAt: r.placed_at.toISOString(),
      placedBy: { id: r.placed_by_id, displayName: r.placed_by_name },
      creditsReserved: r.credits_reserved,
    },
    product: { id: r.product_id, name: r.product_name, matrix: r.matrix },
    clientOrganisation: { id: r.client_id, name: r.client_name },
    intake: r.intake ? { ...intake, recordedBy: { id: recordedById, displayName: recordedByName } } : null,
    intakeWarnings: r.intake
      ? intakeWarnings({ ...intake, arrivedAt: new Date(intake.arrivedAt), obtainedOn: r.obtained_on, matrix: r.matrix }, limitsFrom(r.intake_limits))
      : [],
    photos,
    rejectionReason: r.rejection_reason,
    storageLocation: r.storage_location,
    kind: r.kind,
    referenceLot: r.reference_lot,
    shipment: r.shipped_at ? { carrier: r.carrier, trackingNumber: r.tracking_number, shippedAt: r.shipped_at.toISOString() } : null,
    turnaroundDays: r.turnaround_days,
    revokedReport: revoked?.number ?? null,
    ageDays: timing.ageDays,
    dueAt: timing.dueAt,
  };
}

export async function samplePhotos(manager: EntityManager, labId: string, sampleId: string): Promise<IntakePhoto[]> {
  const rows: { id: string; file_name: string; content_type: string; size_bytes: number; uploaded_at: Date; by_id: string; by_name: string }[] =
    await manager.query(
      `SELECT ph.id, ph.file_name, ph.content_type, ph.size_bytes, ph.uploaded_at, u.id AS by_id, u.display_name AS by_name
       FROM intake_photo ph JOIN app_user u ON u.id = ph.uploaded_by_user_id
       WHERE ph.lab_id = $1 AND ph.sample_id = $2 ORDER BY ph.uploaded_at, ph.entry_no`,
      [labId, sampleId],
    );
  return rows.map((p) => ({
    id: p.id,
    fileName: p.file_name,
    contentType: p.content_type,
    sizeBytes: p.size_bytes,
    uploadedAt: p.uploaded_at.toISOString(),
    uploadedBy: { id: p.by_id, displayName: p.by_name },
  }));
}
