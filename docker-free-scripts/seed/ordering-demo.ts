import type { EntityManager } from 'typeorm';
import type { Matrix } from '@ohmprint/contracts';

/**
 * Invented demo for the producers' side of ordering: each demo producer has one product without a
 * reference library (so enrolment can be shown), and Hollin Ridge Cellars has a reference
 * enrolment order under way (one lot received at the lab, two on their way). Idempotent.
 */
const UNLIBRARIED: { client: string; name: string; matrix: Matrix; description: string }[] = [
  { client: 'Hollin Ridge Cellars', name: 'Hollin Sparkling Rosé (demo)', matrix: 'wine', description: 'Invented demo product: a new sparkling rosé, library not built yet' },
  { client: 'Brightwater Dairy Cooperative', name: 'Brightwater Buttermilk (demo)', matrix: 'milk', description: 'Invented demo product: cultured buttermilk, library not built yet' },
  { client: 'Sunvale Juice Works', name: 'Sunvale Pear Juice (demo)', matrix: 'juice', description: 'Invented demo product: cloudy pear juice, library not built yet' },
  { client: 'Greyfield Preserves', name: 'Greyfield Cider Vinegar (demo)', matrix: 'vinegar', description: 'Invented demo product: unfiltered cider vinegar, library not built yet' },
];

const ENROLMENT = {
  client: 'Hollin Ridge Cellars',
  product: 'Hollin Sparkling Rosé (demo)',
  lots: [
    { code: 'OP-7EN1-R1', lotCode: 'HSR-25-01', producedOn: '2025-09-12', received: true, chemistry: { alcoholPercentVolume: 11.5, pH: 3.2 } },
    { code: 'OP-7EN1-R2', lotCode: 'HSR-25-02', producedOn: '2025-09-26', received: false, chemistry: { alcoholPercentVolume: 11.5 } },
    { code: 'OP-7EN1-R3', lotCode: 'HSR-25-03', producedOn: '2025-10-10', received: false, chemistry: {} },
  ],
};

export async function seedOrderingDemo(manager: EntityManager, now = new Date()): Promise<void> {
  for (const p of UNLIBRARIED) {
    const [org] = await manager.query('SELECT id, lab_id FROM client_organisation WHERE name = $1', [p.client]);
    if (!org) continue;
    await manager.query(
      `INSERT INTO product (lab_id, client_organisation_id, name, matrix, description) VALUES ($1, $2, $3, $4, $5)
       ON CONFLICT (lab_id, client_organisation_id, lower(name)) DO NOTHING`,
      [org.lab_id, org.id, p.name, p.matrix, p.description],
    );
  }
  const [existing] = await manager.query('SELECT 1 FROM sample WHERE code = $1', [ENROLMENT.lots[0].code]);
  if (existing) return;
  const [target] = await manager.query(
    `SELECT p.id AS product_id, p.lab_id, co.id AS org_id,
            (SELECT u.id FROM client_membership cm JOIN app_user u ON u.id = cm.user_id
              WHERE cm.client_organisation_id = co.id AND cm.role = 'client-admin' ORDER BY u.email LIMIT 1) AS admin_id,
            (SELECT u.id FROM app_user u JOIN lab_role_membership lm ON lm.user_id = u.id
              WHERE lm.lab_id = p.lab_id AND lm.role = 'intake-technician' ORDER BY u.email LIMIT 1) AS intake_id
     FROM product p JOIN client_organisation co ON co.id = p.client_organisation_id
     WHERE co.name = $1 AND p.name = $2`,
    [ENROLMENT.client, ENROLMENT.product],
  );
  if (!target?.admin_id || !target.intake_id) return;
  const placedAt = new Date(now.getTime() - 6 * 86_400_000);
  const arrivedAt = new Date(now.getTime() - 86_400_000);
  const [order] = await manager.query(
    `INSERT INTO test_order (lab_id, client_organisation_id, product_id, kind, status, placed_by_user_id, credits_reserved, placed_at,
                             carrier, tracking_number, shipped_at)
     VALUES ($1, $2, $3, 'reference-enrolment', 'in-progress', $4, 0, $5, 'Invented Parcel Ltd', 'IPL-DEMO-0117', $6) RETURNING id`,
    [target.lab_id, target.org_id, target.product_id, target.admin_id, placedAt, new Date(placedAt.getTime() + 86_400_000)],
  );
  for (const lot of ENROLMENT.lots) {
    const [sample] = await manager.query(
      `INSERT INTO sample (lab_id, order_id, code, kind, reference_lot, state, obtained_where, obtained_on, claimed_lot, received_at, state_changed_at, created_at)
       VALUES ($1, $2, $3, 'reference-lot', $4, $5, 'Producer (authentic reference lot)', $6, $7, $8, $9, $10) RETURNING id`,
      [target.lab_id, order.id, lot.code, { lotCode: lot.lotCode, producedOn: lot.producedOn, volumeMl: 750, chemistry: lot.chemistry },
        lot.received ? 'received' : 'awaiting-arrival', lot.producedOn, lot.lotCode, lot.received ? arrivedAt : null, lot.received ? arrivedAt : placedAt, placedAt],
    );
    if (!lot.received) continue;
    await manager.query(
      `INSERT INTO sample_intake (sample_id, lab_id, carrier, tracking_number, arrived_at, temperature_c, seal_intact, container_condition, volume_ml, notes, recorded_by_user_id)
       VALUES ($1, $2, 'Invented Parcel Ltd', 'IPL-DEMO-0117', $3, 14.5, true, 'intact', 750, 'Invented demo arrival', $4)`,
      [sample.id, target.lab_id, arrivedAt, target.intake_id],
    );
    await manager.query(
      `INSERT INTO custody_event (lab_id, sample_id, kind, location, reason, actor_user_id, occurred_at)
       VALUES ($1, $2, 'received', 'Intake bench', 'Arrived by Invented Parcel Ltd (IPL-DEMO-0117)', $3, $4)`,
      [target.lab_id, sample.id, target.intake_id, arrivedAt],
    );
  }
}
