import type { EntityManager } from 'typeorm';
import { consumeCredits, releaseCredits } from '../credits/credit-ledger';

interface HeldCredits {
  id: string;
  code: string;
  credits: number;
  order_id: string;
  client_organisation_id: string;
}

/** The sample's credits if they are still held, with the row locked so they move once. */
async function heldCredits(manager: EntityManager, labId: string, sampleId: string): Promise<HeldCredits | null> {
  const [row]: HeldCredits[] = await manager.query(
    `SELECT s.id, s.code, s.credits, s.order_id, o.client_organisation_id
     FROM sample s JOIN test_order o ON o.id = s.order_id AND o.lab_id = s.lab_id
     WHERE s.id = $1 AND s.lab_id = $2 AND s.credit_state = 'reserved' AND s.credits > 0
     FOR UPDATE OF s`,
    [sampleId, labId],
  );
  return row ?? null;
}

/**
 * Gives a sample's held credits back to its organisation (order cancelled, sample rejected at
 * intake); a sample whose credits already moved, or never had any, is left alone.
 */
export async function releaseSampleCredits(manager: EntityManager, labId: string, sampleId: string, reason: string, actorUserId: string | null): Promise<number> {
  const held = await heldCredits(manager, labId, sampleId);
  if (!held) return 0;
  await releaseCredits(manager, { labId, clientOrganisationId: held.client_organisation_id }, held.credits,
    { reason: `${reason} (${held.code})`, actorUserId, orderId: held.order_id, sampleId });
  await manager.query(`UPDATE sample SET credit_state = 'released' WHERE id = $1 AND lab_id = $2`, [sampleId, labId]);
  return held.credits;
}

/** Spends a sample's held credits: its report is issued, or the lab accepted an enrolled lot. */
export async function consumeSampleCredits(manager: EntityManager, labId: string, sampleId: string, reason: string, actorUserId: string | null): Promise<number> {
  const held = await heldCredits(manager, labId, sampleId);
  if (!held) return 0;
  await consumeCredits(manager, { labId, clientOrganisationId: held.client_organisation_id }, held.credits,
    { reason: `${reason} (${held.code})`, actorUserId, orderId: held.order_id, sampleId });
  await manager.query(`UPDATE sample SET credit_state = 'consumed' WHERE id = $1 AND lab_id = $2`, [sampleId, labId]);
  return held.credits;
}
