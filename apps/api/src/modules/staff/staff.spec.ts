import request from 'supertest';
import { AuditEvent } from '../audit/audit-event.entity';
import { useTestApp } from '../../testing';

const t = useTestApp();

describe('lab staff management', () => {
  it('lists staff with roles, sorted, searched and paged, without client users', async () => {
    const admin = await t.authFor('lab-admin');
    const res = await request(t.app).get('/api/lab/staff?sort=email').set(admin);
    expect(res.status).toBe(200);
    expect(res.body.items.map((s: { email: string }) => s.email)).toEqual(['admin@calder.test', 'analyst@calder.test', 'intake@calder.test', 'reviewer@calder.test']);
    expect(res.body.items[1]).toMatchObject({ roles: ['analyst'], status: 'active' });
    const page = await request(t.app).get('/api/lab/staff?sort=email&dir=desc&page=2&pageSize=3').set(admin);
    expect(page.body).toMatchObject({ total: 4, page: 2, pageSize: 3, items: [{ email: 'admin@calder.test' }] });
    const searched = await request(t.app).get('/api/lab/staff?q=rae').set(admin);
    expect(searched.body.items.map((s: { email: string }) => s.email)).toEqual(['reviewer@calder.test']);
    const literal = await request(t.app).get('/api/lab/staff?q=%25').set(admin);
    expect(literal.body.total).toBe(0);
  });

  it('refuses an unknown sort field and an oversized page with field errors', async () => {
    const res = await request(t.app).get('/api/lab/staff?sort=password_hash&pageSize=1000').set(await t.authFor('lab-admin'));
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['pageSize', 'sort']);
    expect(res.body.detail).toMatch(/query string/);
  });

  it('changes roles, which apply at once to the person’s existing token, and audits before and after', async () => {
    const admin = await t.authFor('lab-admin');
    const intakeId = await t.userIdFor('intake-technician');
    const intakeToken = await t.authFor('intake-technician');
    expect((await request(t.app).get('/api/lab/staff').set(intakeToken)).status).toBe(403);

    const res = await request(t.app).put(`/api/lab/staff/${intakeId}/roles`).set(admin).send({ roles: ['intake-technician', 'lab-admin'] });
    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['intake-technician', 'lab-admin']);
    expect((await request(t.app).get('/api/lab/staff').set(intakeToken)).status).toBe(200);

    const audit = await t.db.manager.findOneByOrFail(AuditEvent, { action: 'staff.roles-changed', subjectId: intakeId });
    expect(audit.details).toEqual({ before: ['intake-technician'], after: ['intake-technician', 'lab-admin'] });

    await request(t.app).put(`/api/lab/staff/${intakeId}/roles`).set(admin).send({ roles: ['intake-technician'] }).expect(200);
  });

  it('refuses to leave the lab without an active lab admin', async () => {
    const admin = await t.authFor('lab-admin');
    const adminId = await t.userIdFor('lab-admin');
    const res = await request(t.app).put(`/api/lab/staff/${adminId}/roles`).set(admin).send({ roles: ['analyst'] });
    expect(res.status).toBe(409);
    expect(res.body.errors).toEqual([{ field: 'roles', message: 'must keep lab-admin for the last lab admin' }]);
    const me = await request(t.app).get('/api/me').set(admin);
    expect(me.body.roles).toEqual(['lab-admin']);
  });

  it('refuses a repeated role', async () => {
    const res = await request(t.app).put(`/api/lab/staff/${await t.userIdFor('analyst')}/roles`).set(await t.authFor('lab-admin')).send({ roles: ['analyst', 'analyst'] });
    expect(res.body.errors).toEqual([{ field: 'roles', message: 'must not repeat a role' }]);
  });

  it('deactivates a staff member: their token stops working and sign-in says why; reactivation restores them', async () => {
    const admin = await t.authFor('lab-admin');
    const reviewerId = await t.userIdFor('reviewer');
    const reviewer = await t.signIn('reviewer@calder.test');
    const res = await request(t.app).post(`/api/lab/staff/${reviewerId}/deactivation`).set(admin);
    expect(res.body.status).toBe('deactivated');
    expect((await request(t.app).get('/api/me').set('Authorization', `Bearer ${reviewer.body.accessToken}`)).status).toBe(403);
    expect((await request(t.app).post('/api/auth/refresh').set('Cookie', reviewer.cookie)).status).toBe(401);
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: 'reviewer@calder.test', password: 'ohmprint-demo-2026' });
    expect(signIn.status).toBe(403);
    expect(signIn.body.detail).toMatch(/deactivated/);

    await request(t.app).post(`/api/lab/staff/${reviewerId}/reactivation`).set(admin).expect(200);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'reviewer@calder.test', password: 'ohmprint-demo-2026' })).status).toBe(200);
  });

  it('refuses to deactivate yourself and a client user (not staff)', async () => {
    const admin = await t.authFor('lab-admin');
    expect((await request(t.app).post(`/api/lab/staff/${await t.userIdFor('lab-admin')}/deactivation`).set(admin)).status).toBe(409);
    expect((await request(t.app).post(`/api/lab/staff/${await t.userIdFor('client-member')}/deactivation`).set(admin)).status).toBe(404);
  });

  it('refuses a malformed id in the URL with a field error', async () => {
    const res = await request(t.app).put('/api/lab/staff/not-a-uuid/roles').set(await t.authFor('lab-admin')).send({ roles: ['analyst'] });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'id', message: 'must be a UUID' }]);
  });
});
