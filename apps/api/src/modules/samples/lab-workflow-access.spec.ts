import request from 'supertest';
import type { Role } from '@ohmprint/contracts';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { useTestApp } from '../../testing';

/**
 * Sign-in, role and tenant checks on every lab-workflow route: no token → 401; a role that may
 * not → 403; the right role in the other demo lab, aimed at a Calder record → 404, as if missing.
 */
jest.setTimeout(30_000);
const t = useTestApp();
const ids: Record<string, string> = {};

const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const one = async (sql: string, params: unknown[] = []) => (await t.db.query(sql, params))[0].id as string;
  ids.sample = await one(`SELECT id FROM sample WHERE code = 'OP-7K3M-Q9'`);
  ids.awaiting = await one(`SELECT id FROM sample WHERE code = 'OP-5QGZ-1M'`);
  ids.received = await one(`SELECT id FROM sample WHERE code = 'OP-1PYF-9C'`);
  ids.order = await one(`SELECT order_id AS id FROM sample WHERE code = 'OP-7K3M-Q9'`);
  ids.cell = await one(`SELECT c.id FROM measurement_cell c JOIN lab l ON l.id = c.lab_id WHERE l.name = 'Calder Analytical'`);
  ids.instrument = await one(`SELECT i.id FROM instrument i JOIN lab l ON l.id = i.lab_id WHERE l.name = 'Calder Analytical'`);
  ids.version = await one(
    `SELECT v.id FROM library_version v JOIN reference_library r ON r.id = v.library_id JOIN product p ON p.id = r.product_id WHERE p.name = 'Ridgeline Red (demo)'`,
  );
  const intake = await t.authFor('intake-technician');
  const photo = await request(t.app).post(`/api/lab/samples/${ids.received}/photos`).set(intake).attach('photos', PNG, 'p.png');
  ids.photo = photo.body[0].id;
  let upload = request(t.app).post(`/api/lab/samples/${ids.sample}/measurements`).set(await t.authFor('analyst')).field('instrumentId', ids.instrument).field('cellId', ids.cell).field('temperatureC', '22.5');
  for (const f of demoFiles().filter((d) => d.sampleCode === 'OP-7K3M-Q9')) upload = upload.attach('files', Buffer.from(f.text), f.fileName);
  ids.replicate = (await upload).body.saved[0].id;
  ids.analysis = (await request(t.app).post(`/api/lab/samples/${ids.sample}/analyses`).set(await t.authFor('analyst')).send({ libraryVersionId: ids.version })).body.id;
  ids.key = (await request(t.app).post('/api/lab/instrument-keys').set(await t.authFor('lab-admin')).send({ name: 'Calder bench' })).body.key.id;
});

const STAFF: Role[] = ['lab-admin', 'intake-technician', 'analyst', 'reviewer'];

interface RouteCase {
  method: 'get' | 'post' | 'put';
  path: () => string;
  allowed: Role[];
  denied: Role;
  body?: () => object;
  files?: 'photo' | 'export';
  /** false for routes with no record of another tenant to aim at (lists are checked below). */
  tenant?: boolean;
}

const arrival = { carrier: 'X', arrivedAt: new Date(Date.now() - 60_000).toISOString(), temperatureC: 5, sealIntact: true, containerCondition: 'intact', volumeMl: 500 };

const ROUTES: RouteCase[] = [
  { method: 'get', path: () => '/lab/samples', allowed: STAFF, denied: 'client-admin', tenant: false },
  { method: 'get', path: () => '/lab/samples/by-code/OP-7K3M-Q9', allowed: STAFF, denied: 'client-member' },
  { method: 'get', path: () => `/lab/samples/${ids.sample}`, allowed: STAFF, denied: 'client-admin' },
  { method: 'post', path: () => `/lab/samples/${ids.awaiting}/arrival`, allowed: ['intake-technician'], denied: 'analyst', body: () => arrival },
  { method: 'post', path: () => `/lab/samples/${ids.received}/photos`, allowed: ['intake-technician'], denied: 'analyst', files: 'photo' },
  { method: 'get', path: () => `/lab/samples/${ids.received}/photos/${ids.photo}`, allowed: STAFF, denied: 'client-member' },
  { method: 'post', path: () => `/lab/samples/${ids.received}/accept`, allowed: ['intake-technician'], denied: 'reviewer', body: () => ({ storageLocation: 'Shelf 1' }) },
  { method: 'post', path: () => `/lab/samples/${ids.received}/reject`, allowed: ['intake-technician'], denied: 'analyst', body: () => ({ reason: 'Leaking container' }) },
  { method: 'get', path: () => `/lab/samples/${ids.sample}/custody`, allowed: STAFF, denied: 'client-admin' },
  { method: 'post', path: () => `/lab/samples/${ids.sample}/custody`, allowed: ['intake-technician', 'analyst', 'lab-admin'], denied: 'reviewer', body: () => ({ kind: 'moved', location: 'Shelf 2', reason: 'Space' }) },
  { method: 'get', path: () => '/lab/bench', allowed: STAFF, denied: 'client-admin', tenant: false },
  { method: 'post', path: () => `/lab/cells/${ids.cell}/calibrations`, allowed: ['analyst', 'lab-admin'], denied: 'intake-technician', body: () => ({ standardName: 'KCl', standardConductivityUsPerCm: 1413, standardTemperatureC: 25, plateauResistanceOhm: 700 }) },
  { method: 'post', path: () => `/lab/samples/${ids.sample}/measurements`, allowed: ['analyst'], denied: 'reviewer', files: 'export' },
  { method: 'get', path: () => `/lab/samples/${ids.sample}/measurements`, allowed: STAFF, denied: 'client-admin' },
  { method: 'get', path: () => `/lab/samples/${ids.sample}/replicates/${ids.replicate}/spectrum`, allowed: STAFF, denied: 'client-member' },
  { method: 'get', path: () => `/lab/samples/${ids.sample}/replicates/${ids.replicate}/file`, allowed: STAFF, denied: 'client-admin' },
  { method: 'post', path: () => `/lab/samples/${ids.sample}/replicates/${ids.replicate}/exclude`, allowed: ['analyst'], denied: 'intake-technician', body: () => ({ reason: 'Air bubble seen' }) },
  { method: 'get', path: () => '/lab/instrument-keys', allowed: ['lab-admin'], denied: 'analyst', tenant: false },
  { method: 'post', path: () => '/lab/instrument-keys', allowed: ['lab-admin'], denied: 'analyst', body: () => ({ name: 'PC' }), tenant: false },
  { method: 'post', path: () => `/lab/instrument-keys/${ids.key}/revoke`, allowed: ['lab-admin'], denied: 'analyst' },
  { method: 'get', path: () => '/lab/libraries', allowed: STAFF, denied: 'client-admin', tenant: false },
  { method: 'get', path: () => `/lab/library-versions/${ids.version}`, allowed: STAFF, denied: 'client-member' },
  { method: 'get', path: () => '/lab/method-settings', allowed: STAFF, denied: 'client-admin', tenant: false },
  { method: 'put', path: () => '/lab/method-settings', allowed: ['lab-admin'], denied: 'analyst', body: () => ({}), tenant: false },
  { method: 'post', path: () => `/lab/samples/${ids.sample}/analyses`, allowed: ['analyst'], denied: 'reviewer', body: () => ({ libraryVersionId: ids.version }) },
  { method: 'get', path: () => '/lab/analyses', allowed: STAFF, denied: 'client-admin', tenant: false },
  { method: 'get', path: () => `/lab/analyses/${ids.analysis}`, allowed: STAFF, denied: 'client-member' },
  { method: 'put', path: () => `/lab/analyses/${ids.analysis}/remarks`, allowed: ['analyst'], denied: 'reviewer', body: () => ({ remarks: 'x' }) },
  { method: 'post', path: () => `/lab/analyses/${ids.analysis}/submit`, allowed: ['analyst'], denied: 'reviewer' },
  { method: 'get', path: () => `/lab/analyses/${ids.analysis}/reproduce`, allowed: STAFF, denied: 'client-admin' },
  { method: 'post', path: () => `/lab/analyses/${ids.analysis}/approve`, allowed: ['reviewer'], denied: 'analyst', body: () => ({}) },
  { method: 'post', path: () => `/lab/analyses/${ids.analysis}/return`, allowed: ['reviewer'], denied: 'analyst', body: () => ({ comments: 'Please redo it' }) },
  { method: 'get', path: () => '/client/orders', allowed: ['client-admin', 'client-member'], denied: 'analyst', tenant: false },
  { method: 'get', path: () => `/client/orders/${ids.order}`, allowed: ['client-admin', 'client-member'], denied: 'lab-admin' },
  { method: 'get', path: () => '/client/products', allowed: ['client-admin', 'client-member'], denied: 'lab-admin', tenant: false },
];

function send(route: RouteCase, auth: Record<string, string>) {
  let req = request(t.app)[route.method](`/api${route.path()}`).set(auth);
  if (route.files === 'photo') return req.attach('photos', PNG, 'p.png');
  if (route.files === 'export') {
    req = req.field('instrumentId', ids.instrument).field('cellId', ids.cell).field('temperatureC', '22.5');
    return req.attach('files', Buffer.from(demoFiles()[0].text), 'rep.csv');
  }
  return route.body ? req.send(route.body()) : req;
}

const label = (r: RouteCase) => `${r.method.toUpperCase()} ${r.path.toString().replace(/^\(\) => /, '')}`;

describe.each(ROUTES)('$method route', (route) => {
  it(`${label(route)}: 401 without sign-in, 403 for ${route.denied}`, async () => {
    expect((await send(route, {})).status).toBe(401);
    const denied = await send(route, await t.authFor(route.denied));
    expect(denied.status).toBe(403);
  });

  if (route.tenant !== false) {
    it(`${label(route)}: 404 for ${route.allowed[0]} of the other lab`, async () => {
      const res = await send(route, await t.authFor(route.allowed[0], 'marlow'));
      expect(res.status).toBe(404);
    });
  }
});

describe('lists are scoped to the caller’s tenant', () => {
  it('shows the other lab none of Calder’s samples, libraries, analyses or keys', async () => {
    const marlow = await t.authFor('lab-admin', 'marlow');
    const samples = await request(t.app).get('/api/lab/samples?pageSize=100').set(marlow);
    expect(samples.body.items.map((s: { code: string }) => s.code)).toEqual(['OP-0GRY-5N']);
    const libraries = await request(t.app).get('/api/lab/libraries').set(marlow);
    expect(libraries.body.items.map((l: { product: { name: string } }) => l.product.name)).toEqual(['Greyfield Apple Juice (demo)']);
    expect((await request(t.app).get('/api/lab/analyses').set(marlow)).body.total).toBe(0);
    expect((await request(t.app).get('/api/lab/instrument-keys').set(marlow)).body).toEqual([]);
    const bench = await request(t.app).get('/api/lab/bench').set(marlow);
    expect(bench.body.cells.map((c: { id: string }) => c.id)).not.toContain(ids.cell);
  });

  it('shows a client of another organisation in the same lab none of the order', async () => {
    const { body } = await t.signIn('admin@brightwater.test');
    const other = { Authorization: `Bearer ${body.accessToken}` };
    expect((await request(t.app).get(`/api/client/orders/${ids.order}`).set(other)).status).toBe(404);
    const orders = await request(t.app).get('/api/client/orders').set(other);
    expect(orders.body.items.every((o: { clientOrganisation: { name: string } }) => o.clientOrganisation.name === 'Brightwater Dairy Cooperative')).toBe(true);
  });
});
