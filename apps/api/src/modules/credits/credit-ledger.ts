import type { EntityManager } from 'typeorm';
import { ApiError } from '../../core/api-error';
import { CreditLedgerEntry, type CreditMovementKind } from './credit-ledger-entry.entity';

/** Whose credits: always from the signed-in user or from a row already scoped to the lab. */
export interface CreditScope {
  labId: string;
  clientOrganisationId: string;
}

export interface CreditBalance {
  available: number;
  reserved: number;
}

/** Why credits move and what the movement refers to; `reason` is shown in the ledger. */
export interface CreditMovementNote {
  reason: string;
  actorUserId: string | null;
  orderId?: string | null;
  sampleId?: string | null;
  paymentId?: string | null;
}

interface Movement extends CreditMovementNote {
  kind: CreditMovementKind;
  availableChange: number;
  reservedChange: number;
}

function assertWholePositive(amount: number): void {
  if (!Number.isInteger(amount) || amount <= 0) throw new Error(`credit amounts are whole numbers above zero, not ${amount}`);
}

/** The organisation's balance; an organisation that never held credits has 0 and 0. */
export async function creditBalance(manager: EntityManager, scope: CreditScope): Promise<CreditBalance> {
  const rows: CreditBalance[] = await manager.query(
    'SELECT available, reserved FROM credit_account WHERE lab_id = $1 AND client_organisation_id = $2',
    [scope.labId, scope.clientOrganisationId],
  );
  return rows[0] ?? { available: 0, reserved: 0 };
}

/**
 * Applies one movement atomically: the account row is updated only when neither figure would go
 * below zero (the row lock orders concurrent movements; CHECK constraints back it up), and the
 * ledger entry records the figures after it. Returns the new balance, or null when it would overdraw.
 */
async function applyMovement(manager: EntityManager, scope: CreditScope, movement: Movement): Promise<CreditBalance | null> {
  await manager.query(
    `INSERT INTO credit_account (client_organisation_id, lab_id)
       SELECT id, lab_id FROM client_organisation WHERE id = $1 AND lab_id = $2
     ON CONFLICT (client_organisation_id) DO NOTHING`,
    [scope.clientOrganisationId, scope.labId],
  );
  // TypeORM answers an UPDATE … RETURNING with [rows, affected].
  const [rows]: [CreditBalance[], number] = await manager.query(
    `UPDATE credit_account
        SET available = available + $3, reserved = reserved + $4, updated_at = now()
      WHERE lab_id = $1 AND client_organisation_id = $2
        AND available + $3 >= 0 AND reserved + $4 >= 0
      RETURNING available, reserved`,
    [scope.labId, scope.clientOrganisationId, movement.availableChange, movement.reservedChange],
  );
  const after = rows[0];
  if (!after) return null;
  await manager.insert(CreditLedgerEntry, {
    labId: scope.labId,
    clientOrganisationId: scope.clientOrganisationId,
    kind: movement.kind,
    availableChange: movement.availableChange,
    reservedChange: movement.reservedChange,
    availableAfter: after.available,
    reservedAfter: after.reserved,
    reason: movement.reason,
    orderId: movement.orderId ?? null,
    sampleId: movement.sampleId ?? null,
    paymentId: movement.paymentId ?? null,
    actorUserId: movement.actorUserId,
  });
  return after;
}

async function shortfall(manager: EntityManager, scope: CreditScope, needed: number, what: string): Promise<ApiError> {
  const { available } = await creditBalance(manager, scope);
  const missing = needed - available;
  return new ApiError(409, 'Not enough credits', `${what} needs ${needed} credit${needed === 1 ? '' : 's'}; ` +
    `${available} ${available === 1 ? 'is' : 'are'} available, so ${missing} ${missing === 1 ? 'is' : 'are'} missing.`, {
    type: 'insufficient-credits',
    extensions: { needed, available, shortfall: missing },
  });
}

/** Holds credits for an order; 409 `insufficient-credits` (with `needed`, `available`, `shortfall`) when too few. */
export async function reserveCredits(manager: EntityManager, scope: CreditScope, amount: number, note: CreditMovementNote): Promise<CreditBalance> {
  assertWholePositive(amount);
  const after = await applyMovement(manager, scope, { ...note, kind: 'reserve', availableChange: -amount, reservedChange: amount });
  if (!after) throw await shortfall(manager, scope, amount, 'This order');
  return after;
}

/** Gives held credits back (an order cancelled, a sample rejected at intake). */
export async function releaseCredits(manager: EntityManager, scope: CreditScope, amount: number, note: CreditMovementNote): Promise<CreditBalance> {
  assertWholePositive(amount);
  const after = await applyMovement(manager, scope, { ...note, kind: 'release', availableChange: amount, reservedChange: -amount });
  if (!after) throw new Error(`cannot release ${amount} credits: fewer are reserved`);
  return after;
}

/** Spends held credits (a report issued: call it inside the issuance transaction). */
export async function consumeCredits(manager: EntityManager, scope: CreditScope, amount: number, note: CreditMovementNote): Promise<CreditBalance> {
  assertWholePositive(amount);
  const after = await applyMovement(manager, scope, { ...note, kind: 'consume', availableChange: 0, reservedChange: -amount });
  if (!after) throw new Error(`cannot consume ${amount} credits: fewer are reserved`);
  return after;
}

/** Adds spendable credits: a paid purchase, or a lab admin's adjustment. */
export async function addCredits(manager: EntityManager, scope: CreditScope, amount: number, kind: 'purchase' | 'adjustment',
  note: CreditMovementNote): Promise<CreditBalance> {
  assertWholePositive(amount);
  const after = await applyMovement(manager, scope, { ...note, kind, availableChange: amount, reservedChange: 0 });
  if (!after) throw ApiError.notFound('Client organisation');
  return after;
}

/**
 * Takes spendable credits away: a refunded purchase, or a lab admin's adjustment. 409
 * `insufficient-credits` when fewer are available (credits already reserved or spent stay so).
 */
export async function removeCredits(manager: EntityManager, scope: CreditScope, amount: number, kind: 'refund' | 'adjustment',
  note: CreditMovementNote): Promise<CreditBalance> {
  assertWholePositive(amount);
  const after = await applyMovement(manager, scope, { ...note, kind, availableChange: -amount, reservedChange: 0 });
  if (!after) throw await shortfall(manager, scope, amount, kind === 'refund' ? 'This refund' : 'This adjustment');
  return after;
}
