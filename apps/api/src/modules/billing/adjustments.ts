import type { EntityManager } from 'typeorm';
import type { CreditAdjustment } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { addCredits, removeCredits, type CreditBalance } from '../credits/credit-ledger';

/** A lab admin's manual correction, with its reason, in the ledger and the audit log together. */
export async function adjustCredits(manager: EntityManager, labId: string, actorUserId: string, input: CreditAdjustment): Promise<{ balance: CreditBalance; entryId: string }> {
  const [org]: { id: string; name: string }[] = await manager.query('SELECT id, name FROM client_organisation WHERE id = $1 AND lab_id = $2', [input.clientOrganisationId, labId]);
  if (!org) throw ApiError.notFound('Client organisation');
  const scope = { labId, clientOrganisationId: org.id };
  const note = { reason: input.reason, actorUserId };
  const balance = input.change > 0
    ? await addCredits(manager, scope, input.change, 'adjustment', note)
    : await removeCredits(manager, scope, -input.change, 'adjustment', note);
  const [entry]: { id: string }[] = await manager.query(
    `SELECT id FROM credit_ledger_entry WHERE lab_id = $1 AND client_organisation_id = $2 AND kind = 'adjustment' ORDER BY entry_no DESC LIMIT 1`, [labId, org.id]);
  await recordAudit(manager, { labId, actorUserId, action: 'credits.adjusted', subjectType: 'client-organisation', subjectId: org.id,
    details: { change: input.change, reason: input.reason, availableAfter: balance.available, ledgerEntryId: entry.id } });
  return { balance, entryId: entry.id };
}
