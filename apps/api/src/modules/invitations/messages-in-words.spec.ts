import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { latestEmailTo, useTestApp } from '../../testing';

// Seeding the demo libraries in beforeAll takes seconds on a busy two-core machine.
jest.setTimeout(120_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

/** Codes of the roles, states and fields a person must never read in a message. */
const RAW = /client-admin|client-member|lab-admin|intake-technician|awaiting-arrival|in-review|returned-for-rework|arrivedAt|temperatureC|occurredAt/;

describe('what people read names roles, states and fields in words', () => {
  it('a staff invitation names the roles as a sentence does', async () => {
    const sent = await request(t.app).post('/api/lab/staff/invitations').set(await t.authFor('lab-admin'))
      .send({ email: 'two.roles@calder.test', roles: ['intake-technician', 'analyst'] });
    expect(sent.status).toBe(201);
    const mail = await latestEmailTo(t.db, 'two.roles@calder.test');
    expect(mail.text).toContain('on Ohmprint as an intake technician and analyst.');
    expect(mail.text).not.toMatch(RAW);
  });

  it('a producer’s first admin is invited as a client admin, a colleague as a client member', async () => {
    const created = await request(t.app).post('/api/lab/client-organisations').set(await t.authFor('lab-admin'))
      .send({ name: 'Wordsworth Brine Co (demo)', firstAdmin: { email: 'first@wordsworth.test' } });
    expect(created.status).toBe(201);
    const first = await latestEmailTo(t.db, 'first@wordsworth.test');
    expect(first.text).toContain('on Ohmprint as a client admin.');
    expect(first.text).not.toMatch(RAW);

    const admin = await t.authFor('client-admin');
    const invited = await request(t.app).post('/api/client/team/invitations').set(admin).send({ email: 'colleague@hollinridge.test' });
    expect(invited.status).toBe(201);
    expect((await latestEmailTo(t.db, 'colleague@hollinridge.test')).text).toContain('as a client member.');
  });

  it('a refused role names the roles that may, in words', async () => {
    const res = await request(t.app).get('/api/lab/staff').set(await t.authFor('analyst'));
    expect(res.status).toBe(403);
    expect(res.body.detail).toBe('Only these roles may do this: lab admin.');
  });

  it('a sample in the wrong state is named by its state in words', async () => {
    const [{ id }] = await t.db.query(`SELECT id FROM sample WHERE code = 'OP-3VNC-8P'`);
    const res = await request(t.app).post(`/api/lab/samples/${id}/accept`).set(await t.authFor('intake-technician')).send({ storageLocation: 'Rack 1' });
    expect(res.status).toBe(409);
    expect(res.body.detail).toMatch(/^Sample OP-3VNC-8P is awaiting arrival; .* needs it to be received\.$/);
  });

  it('an invalid field is named in words in the message, and by its path for the form', async () => {
    const [{ id }] = await t.db.query(`SELECT id FROM sample WHERE code = 'OP-3VNC-8P'`);
    const res = await request(t.app).post(`/api/lab/samples/${id}/arrival`).set(await t.authFor('intake-technician'))
      .send({ carrier: 'Invented Courier Co.', trackingNumber: 'T-1', arrivedAt: 'yesterday', temperatureC: 'cold', sealIntact: true, containerCondition: 'intact', volumeMl: 750 });
    expect(res.status).toBe(400);
    expect(res.body.detail).toContain('arrival time');
    expect(res.body.detail).toContain('temperature (°C)');
    expect(res.body.detail).not.toMatch(RAW);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['arrivedAt', 'temperatureC']);
  });
});
