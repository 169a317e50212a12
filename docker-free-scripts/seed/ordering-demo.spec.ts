import request from 'supertest';
import { useTestApp } from '../../apps/api/src/testing';
import { seedLabDemo } from './lab-demo';
import { seedOrderingDemo } from './ordering-demo';

jest.setTimeout(60_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  await t.db.transaction((m) => seedOrderingDemo(m));
  await t.db.transaction((m) => seedOrderingDemo(m));
});

describe('ordering demo', () => {
  it('gives each demo producer a product without a library, once however often it runs', async () => {
    const rows = await t.db.query(`SELECT co.name, count(*)::int AS n FROM product p JOIN client_organisation co ON co.id = p.client_organisation_id
      WHERE p.description LIKE '%library not built yet' GROUP BY co.name ORDER BY co.name`);
    expect(rows).toEqual([
      { name: 'Brightwater Dairy Cooperative', n: 1 },
      { name: 'Greyfield Preserves', n: 1 },
      { name: 'Hollin Ridge Cellars', n: 1 },
      { name: 'Sunvale Juice Works', n: 1 },
    ]);
    const products = await request(t.app).get('/api/client/products?q=Buttermilk').set(await t.signIn('admin@brightwater.test').then((s) => ({ Authorization: `Bearer ${s.body.accessToken}` })));
    expect(products.body.items[0]).toMatchObject({ libraryState: 'none', publishedLibraryVersion: null });
  });

  it('shows one enrolment order under way: a reference lot received at intake, two on their way', async () => {
    const orders = await request(t.app).get('/api/client/orders?kind=reference-enrolment').set(await t.authFor('client-admin'));
    expect(orders.body.total).toBe(1);
    expect(orders.body.items[0]).toMatchObject({ status: 'in-progress', kind: 'reference-enrolment', shipment: { carrier: 'Invented Parcel Ltd' } });
    expect(orders.body.items[0].samples.map((s: { state: string }) => s.state)).toEqual(['received', 'awaiting-arrival', 'awaiting-arrival']);
    const atIntake = await request(t.app).get('/api/lab/samples/by-code/OP-7EN1-R1').set(await t.authFor('intake-technician'));
    expect(atIntake.body).toMatchObject({ kind: 'reference-lot', referenceLot: { lotCode: 'HSR-25-01' }, intake: { carrier: 'Invented Parcel Ltd' } });
    const products = await request(t.app).get('/api/client/products?q=Sparkling').set(await t.authFor('client-admin'));
    expect(products.body.items[0].libraryState).toBe('building');
  });
});
