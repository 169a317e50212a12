// Invented demo data for billing: credit packs with made-up prices per demo lab, and for each demo
// producer a small balance and a short payment history (one paid, one abandoned; one refunded for
// the first producer). Payments carry `is_demo` and `cs_demo_…` ids: they exist only here, not at
// the payment service. Idempotent: a lab that already has packs is left alone.
import { randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { CreditPackRow } from '../../apps/api/src/modules/billing/credit-pack.entity';
import { PaymentRow } from '../../apps/api/src/modules/billing/payment.entity';
import { addCredits, removeCredits } from '../../apps/api/src/modules/credits/credit-ledger';
import { DEMO_LABS } from './accounts-demo-data';

/** Invented prices (minor units) per demo lab. */
const DEMO_PACKS: Record<string, { currency: string; packs: { name: string; credits: number; price: number; active?: boolean }[] }> = {
  calder: { currency: 'eur', packs: [
    { name: 'Single check (demo)', credits: 1, price: 4900 },
    { name: 'Ten checks (demo)', credits: 10, price: 42000 },
    { name: 'Harvest season (demo)', credits: 25, price: 97500 },
    { name: 'Launch offer (demo, retired)', credits: 5, price: 15000, active: false },
  ] },
  marlow: { currency: 'gbp', packs: [
    { name: 'Single check (demo)', credits: 1, price: 3900 },
    { name: 'Twelve checks (demo)', credits: 12, price: 39000 },
  ] },
};

const daysAgo = (now: Date, days: number) => new Date(now.getTime() - days * 86_400_000);
const demoSession = () => `cs_demo_${randomBytes(10).toString('hex')}`;

export async function seedBillingDemo(manager: EntityManager, now = new Date()): Promise<void> {
  for (const demo of DEMO_LABS) {
    const [lab]: { id: string }[] = await manager.query('SELECT id FROM lab WHERE name = $1', [demo.name]);
    if (!lab || (await manager.count(CreditPackRow, { where: { labId: lab.id } })) > 0) continue;
    const plan = DEMO_PACKS[demo.key];
    const packs: CreditPackRow[] = [];
    for (const p of plan.packs) {
      const { identifiers } = await manager.insert(CreditPackRow, { labId: lab.id, name: p.name, credits: p.credits, priceMinor: String(p.price), currency: plan.currency, active: p.active ?? true });
      packs.push(await manager.findOneByOrFail(CreditPackRow, { id: identifiers[0].id as string }));
    }
    const [small, ten] = packs;
    for (const [i, client] of demo.clients.entries()) {
      const [row]: { id: string; admin_id: string | null }[] = await manager.query(
        `SELECT co.id, (SELECT u.id FROM app_user u JOIN client_membership m ON m.user_id = u.id WHERE m.client_organisation_id = co.id AND u.email = $3) AS admin_id
         FROM client_organisation co WHERE co.lab_id = $1 AND co.name = $2`,
        [lab.id, client.name, client.members.find((m) => m.role === 'client-admin')?.email ?? ''],
      );
      if (!row) continue;
      const scope = { labId: lab.id, clientOrganisationId: row.id };
      const payment = async (pack: CreditPackRow, status: PaymentRow['status'], days: number, extra: Partial<PaymentRow> = {}) => {
        const { identifiers } = await manager.insert(PaymentRow, {
          labId: lab.id, clientOrganisationId: row.id, creditPackId: pack.id, packName: pack.name, credits: pack.credits, amountMinor: pack.priceMinor,
          currency: pack.currency, priceId: 'price_demo', checkoutSessionId: demoSession(), status, startedByUserId: row.admin_id, isDemo: true,
          createdAt: daysAgo(now, days), updatedAt: daysAgo(now, days), ...extra,
        });
        return identifiers[0].id as string;
      };
      const paid = await payment(ten, 'paid', 40 - i, { paidAt: daysAgo(now, 40 - i) });
      await addCredits(manager, scope, ten.credits, 'purchase', { reason: `Bought ${ten.name}`, actorUserId: row.admin_id, paymentId: paid });
      await payment(small, 'expired', 12 - i);
      if (i === 0) {
        const refunded = await payment(small, 'refunded', 30, { paidAt: daysAgo(now, 30), refundedAt: daysAgo(now, 29) });
        await addCredits(manager, scope, small.credits, 'purchase', { reason: `Bought ${small.name}`, actorUserId: row.admin_id, paymentId: refunded });
        await removeCredits(manager, scope, small.credits, 'refund', { reason: `Refund of ${small.name} (bought twice by mistake, demo)`, actorUserId: null, paymentId: refunded });
        await payment(small, 'declined', 5, { failureMessage: 'Your card was declined. (demo)' });
      }
    }
  }
}
