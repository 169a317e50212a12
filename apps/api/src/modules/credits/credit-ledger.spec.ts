import { useTestApp } from '../../testing';
import { ClientMembership } from '../client-organisations/client-membership.entity';
import { ApiError } from '../../core/api-error';
import { addCredits, consumeCredits, creditBalance, releaseCredits, removeCredits, reserveCredits, type CreditScope } from './credit-ledger';

const t = useTestApp();

async function clientScope(): Promise<CreditScope> {
  const userId = await t.userIdFor('client-admin');
  const membership = await t.db.manager.findOneOrFail(ClientMembership, { where: { userId } });
  const [org] = await t.db.query('SELECT lab_id FROM client_organisation WHERE id = $1', [membership.clientOrganisationId]);
  return { labId: org.lab_id, clientOrganisationId: membership.clientOrganisationId };
}

describe('credit ledger', () => {
  it('reserves, releases, consumes and records every movement with the balance after it', async () => {
    const scope = await clientScope();
    const actorUserId = await t.userIdFor('client-admin');
    await t.db.transaction(async (m) => {
      await addCredits(m, scope, 10, 'purchase', { reason: 'Pack bought', actorUserId });
      await reserveCredits(m, scope, 3, { reason: 'Order placed', actorUserId });
      await releaseCredits(m, scope, 1, { reason: 'Sample rejected at intake', actorUserId });
      await consumeCredits(m, scope, 2, { reason: 'Report issued', actorUserId });
    });
    expect(await creditBalance(t.db.manager, scope)).toEqual({ available: 8, reserved: 0 });
    const entries = await t.db.query(
      'SELECT kind, available_change, reserved_change, available_after, reserved_after FROM credit_ledger_entry WHERE client_organisation_id = $1 ORDER BY entry_no',
      [scope.clientOrganisationId]);
    expect(entries).toEqual([
      { kind: 'purchase', available_change: 10, reserved_change: 0, available_after: 10, reserved_after: 0 },
      { kind: 'reserve', available_change: -3, reserved_change: 3, available_after: 7, reserved_after: 3 },
      { kind: 'release', available_change: 1, reserved_change: -1, available_after: 8, reserved_after: 2 },
      { kind: 'consume', available_change: 0, reserved_change: -2, available_after: 8, reserved_after: 0 },
    ]);
  });

  it('lets exactly as many concurrent reservations through as there are credits', async () => {
    const scope = await clientScope();
    const actorUserId = await t.userIdFor('client-admin');
    const { available } = await creditBalance(t.db.manager, scope);
    if (available > 0) await t.db.transaction((m) => removeCredits(m, scope, available, 'adjustment', { reason: 'test reset', actorUserId }));
    await t.db.transaction((m) => addCredits(m, scope, 5, 'purchase', { reason: 'Pack bought', actorUserId }));
    const outcomes = await Promise.allSettled(Array.from({ length: 20 }, () =>
      t.db.transaction((m) => reserveCredits(m, scope, 1, { reason: 'Order placed', actorUserId }))));
    expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(5);
    const refusals = outcomes.filter((o): o is PromiseRejectedResult => o.status === 'rejected').map((o) => o.reason as ApiError);
    expect(refusals).toHaveLength(15);
    expect(refusals.every((e) => e.status === 409 && e.extensions?.shortfall === 1)).toBe(true);
    expect((await creditBalance(t.db.manager, scope)).available).toBe(0);
  });

  it('refuses to overdraw and names the shortfall', async () => {
    const scope = await clientScope();
    const { available } = await creditBalance(t.db.manager, scope);
    await expect(t.db.transaction((m) => reserveCredits(m, scope, available + 4, { reason: 'Order placed', actorUserId: null })))
      .rejects.toMatchObject({ status: 409, extensions: { needed: available + 4, available, shortfall: 4 } });
  });

  it('keeps the ledger append-only and the balance non-negative even for direct SQL', async () => {
    const scope = await clientScope();
    await t.db.transaction((m) => addCredits(m, scope, 1, 'adjustment', { reason: 'Goodwill', actorUserId: null }));
    await expect(t.db.query('UPDATE credit_ledger_entry SET reason = $1', ['rewritten'])).rejects.toThrow(/append-only/);
    await expect(t.db.query('DELETE FROM credit_ledger_entry')).rejects.toThrow(/append-only/);
    await expect(t.db.query('UPDATE credit_account SET available = -1 WHERE client_organisation_id = $1', [scope.clientOrganisationId]))
      .rejects.toThrow(/credit_account_available_not_negative/);
  });
});
