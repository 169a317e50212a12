import { useTestApp } from '../../apps/api/src/testing';
import { seedBillingDemo } from './billing-demo';

const t = useTestApp();

describe('billing demo (invented data)', () => {
  it('gives each demo producer packs to buy, a small balance, a payment history and one refunded payment; twice is once', async () => {
    await t.db.transaction((m) => seedBillingDemo(m));
    await t.db.transaction((m) => seedBillingDemo(m));
    const packs = await t.db.query(`SELECT l.name AS lab, count(*) FILTER (WHERE p.active)::int AS on_sale FROM credit_pack p JOIN lab l ON l.id = p.lab_id GROUP BY l.name ORDER BY l.name`);
    expect(packs).toEqual([{ lab: 'Calder Analytical', on_sale: 3 }, { lab: 'Marlow Test House', on_sale: 2 }]);
    const balances = await t.db.query(`SELECT co.name, a.available, a.reserved FROM credit_account a JOIN client_organisation co ON co.id = a.client_organisation_id ORDER BY co.name`);
    expect(balances.length).toBeGreaterThanOrEqual(4);
    for (const b of balances) expect(b.available).toBeGreaterThan(0);
    const [{ n: refunded }] = await t.db.query(`SELECT count(*)::int AS n FROM payment WHERE status = 'refunded'`);
    expect(refunded).toBe(2);
    const [{ n: notDemo }] = await t.db.query(`SELECT count(*)::int AS n FROM payment WHERE NOT is_demo OR checkout_session_id NOT LIKE 'cs_demo_%'`);
    expect(notDemo).toBe(0);
  });
});
