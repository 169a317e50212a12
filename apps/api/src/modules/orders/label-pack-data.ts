import type { EntityManager } from 'typeorm';
import { MATRIX_LABELS, type Matrix, type ReferenceLotDeclaration } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { ClientScope } from './client-views';

export interface LabelPackSample {
  code: string;
  kind: 'check' | 'reference-lot';
  lotClaimed: string;
  obtainedWhere: string;
  obtainedOn: string;
  container: string;
  referenceLot: ReferenceLotDeclaration | null;
}

/** Plain data for the label pack PDF: everything it prints, nothing it must look up. */
export interface LabelPackData {
  orderRef: string;
  orderKind: 'check' | 'reference-enrolment';
  cancelled: boolean;
  placedAt: string;
  placedBy: string;
  product: string;
  matrix: string;
  client: string;
  lab: { name: string; legalName: string };
  shipTo: string[];
  instructions: string;
  carrier: string;
  trackingNumber: string;
  samples: LabelPackSample[];
}

/** Used when the lab has not written its own shipping instructions yet (common practice for liquid samples). */
export const DEFAULT_SHIPPING_INSTRUCTIONS =
  'Stick each label on its own sample container, across the closure as a seal where you can. Pack the samples upright ' +
  'with absorbent material in a leak-proof outer box; keep perishable samples (milk, juice) cool. Put the signed custody ' +
  'form in the parcel and keep a copy. Send the parcel early in the week so it does not wait over a weekend.';

/** A short reference for the order that people can read aloud: the first eight characters of its id. */
export const orderRef = (orderId: string): string => orderId.slice(0, 8).toUpperCase();

export async function labelPackData(manager: EntityManager, scope: ClientScope, orderId: string): Promise<LabelPackData> {
  const [o] = await manager.query(
    `SELECT o.id, o.kind, o.status, o.placed_at, o.carrier, o.tracking_number, u.display_name AS placed_by, p.name AS product, p.matrix,
            co.name AS client, l.name AS lab_name, l.legal_name, l.address, l.shipping_address, l.shipping_instructions
     FROM test_order o
     JOIN product p ON p.id = o.product_id AND p.lab_id = o.lab_id
     JOIN client_organisation co ON co.id = o.client_organisation_id AND co.lab_id = o.lab_id
     JOIN lab l ON l.id = o.lab_id
     JOIN app_user u ON u.id = o.placed_by_user_id
     WHERE o.id = $1 AND o.lab_id = $2 AND o.client_organisation_id = $3`,
    [orderId, scope.labId, scope.clientOrganisationId],
  );
  if (!o) throw ApiError.notFound('Order');
  const samples: LabelPackSample[] = (
    await manager.query(
      `SELECT code, kind, claimed_lot, obtained_where, to_char(obtained_on, 'YYYY-MM-DD') AS obtained_on, container, reference_lot
       FROM sample WHERE order_id = $1 AND lab_id = $2 ORDER BY code`,
      [orderId, scope.labId],
    )
  ).map((s: Record<string, unknown>) => ({
    code: s.code as string,
    kind: s.kind as LabelPackSample['kind'],
    lotClaimed: s.claimed_lot as string,
    obtainedWhere: s.obtained_where as string,
    obtainedOn: s.obtained_on as string,
    container: s.container as string,
    referenceLot: s.reference_lot as ReferenceLotDeclaration | null,
  }));
  const address = ((o.shipping_address as string).trim() || (o.address as string)).split(/\r?\n|,\s*/).map((line) => line.trim()).filter(Boolean);
  return {
    orderRef: orderRef(o.id),
    orderKind: o.kind,
    cancelled: o.status === 'cancelled',
    placedAt: (o.placed_at as Date).toISOString(),
    placedBy: o.placed_by,
    product: o.product,
    matrix: MATRIX_LABELS[o.matrix as Matrix],
    client: o.client,
    lab: { name: o.lab_name, legalName: o.legal_name },
    shipTo: [`${o.legal_name} — sample reception`, ...address],
    instructions: (o.shipping_instructions as string).trim() || DEFAULT_SHIPPING_INSTRUCTIONS,
    carrier: o.carrier,
    trackingNumber: o.tracking_number,
    samples,
  };
}
