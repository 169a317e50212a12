import request from 'supertest';
import { AuditEvent } from '../audit/audit-event.entity';
import { latestEmailTo, linkToken, useTestApp } from '../../testing';

const t = useTestApp();

describe('the platform operator’s labs', () => {
  it('lists the lab tenants with their profiles and staff counts, searchable and sortable', async () => {
    const operator = await t.authFor('platform-operator');
    const all = await request(t.app).get('/api/operator/labs?sort=name').set(operator);
    expect(all.status).toBe(200);
    expect(all.body.items.map((l: { name: string }) => l.name)).toEqual(['Calder Analytical', 'Marlow Test House']);
    expect(all.body.items[0]).toMatchObject({ status: 'active', staffCount: 4, accreditationNumber: 'DEMO-17025-0412' });
    const found = await request(t.app).get('/api/operator/labs?q=marlow').set(operator);
    expect(found.body.items.map((l: { name: string }) => l.name)).toEqual(['Marlow Test House']);
    const paged = await request(t.app).get('/api/operator/labs?sort=name&dir=desc&pageSize=1&page=2').set(operator);
    expect(paged.body).toMatchObject({ total: 2, page: 2, pageSize: 1, items: [{ name: 'Calder Analytical' }] });
  });

  it('creates a lab with its first admin invitation; the admin accepts into an empty lab', async () => {
    const res = await request(t.app)
      .post('/api/operator/labs')
      .set(await t.authFor('platform-operator'))
      .send({ name: 'Fenmoor Lab (demo)', legalName: 'Fenmoor Lab Ltd (demo)', address: '1 Invented Row, Demoshire', firstAdmin: { email: 'head@fenmoor.test' } });
    expect(res.status).toBe(201);
    expect(res.body.lab).toMatchObject({ name: 'Fenmoor Lab (demo)', status: 'active', staffCount: 0, turnaroundTargetDays: 10 });
    const { token } = linkToken((await latestEmailTo(t.db, 'head@fenmoor.test')).text);
    const accepted = await request(t.app).post('/api/invitations/accept').send({ token, displayName: 'Fen Head', password: 'fenmoor-passphrase' });
    expect(accepted.body.user).toMatchObject({ roles: ['lab-admin'], lab: { name: 'Fenmoor Lab (demo)' } });
    const staff = await request(t.app).get('/api/lab/staff').set('Authorization', `Bearer ${accepted.body.accessToken}`);
    expect(staff.body.items.map((s: { email: string }) => s.email)).toEqual(['head@fenmoor.test']);
  });

  it('reports every invalid field of a new lab at once', async () => {
    const res = await request(t.app).post('/api/operator/labs').set(await t.authFor('platform-operator')).send({ name: 'X', turnaroundTargetDays: 'soon', firstAdmin: { email: 'not-an-address' } });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['address', 'firstAdmin.email', 'legalName', 'name', 'turnaroundTargetDays']);
  });

  it('suspends a lab: its users are signed out, cannot sign in and are told why; reactivation restores them', async () => {
    const operator = await t.authFor('platform-operator');
    const marlowId = (await t.db.query(`SELECT id FROM lab WHERE name = 'Marlow Test House'`))[0].id;
    const session = await t.signIn('analyst@marlow.test');
    const analystToken = { Authorization: `Bearer ${session.body.accessToken}` };

    const noReason = await request(t.app).patch(`/api/operator/labs/${marlowId}`).set(operator).send({ status: 'suspended' });
    expect(noReason.body.errors).toEqual([{ field: 'reason', message: 'is required' }]);

    const suspended = await request(t.app).patch(`/api/operator/labs/${marlowId}`).set(operator).send({ status: 'suspended', reason: 'Unpaid platform invoice (demo)' });
    expect(suspended.body.status).toBe('suspended');

    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@marlow.test', password: 'ohmprint-demo-2026' });
    expect(signIn.status).toBe(403);
    expect(signIn.body.detail).toBe('Marlow Test House is suspended on Ohmprint, so its accounts cannot sign in. Contact the platform operator.');
    expect((await request(t.app).get('/api/me').set(analystToken)).status).toBe(403);
    expect((await request(t.app).post('/api/auth/refresh').set('Cookie', session.cookie)).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: 'ohmprint-demo-2026' })).status).toBe(200);

    await request(t.app).patch(`/api/operator/labs/${marlowId}`).set(operator).send({ status: 'active', reason: 'Invoice settled (demo)' }).expect(200);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@marlow.test', password: 'ohmprint-demo-2026' })).status).toBe(200);
    const actions = (await t.db.manager.find(AuditEvent, { where: { subjectId: marlowId }, order: { createdAt: 'ASC' } })).map((e) => e.action);
    expect(actions).toEqual(['lab.suspended', 'lab.reactivated']);
  });

  it('answers an unknown lab with 404', async () => {
    const res = await request(t.app).get('/api/operator/labs/00000000-0000-4000-8000-000000000001').set(await t.authFor('platform-operator'));
    expect(res.status).toBe(404);
  });
});
