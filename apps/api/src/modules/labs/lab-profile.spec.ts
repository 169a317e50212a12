import request from 'supertest';
import { useTestApp } from '../../testing';

const t = useTestApp();

describe('lab profile and audit log', () => {
  it('shows the lab’s profile to its staff', async () => {
    const res = await request(t.app).get('/api/lab/profile').set(await t.authFor('intake-technician'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'Calder Analytical', accreditationNumber: 'DEMO-17025-0412', turnaroundTargetDays: 7, status: 'active' });
  });

  it('lets the lab admin change it; the change is in the audit log with before and after', async () => {
    const admin = await t.authFor('lab-admin');
    const res = await request(t.app).patch('/api/lab/profile').set(admin).send({ turnaroundTargetDays: 5, accreditationNumber: 'DEMO-17025-0413' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ turnaroundTargetDays: 5, accreditationNumber: 'DEMO-17025-0413', name: 'Calder Analytical' });

    const log = await request(t.app).get('/api/lab/audit-events?action=lab.profile-changed').set(admin);
    expect(log.body.total).toBe(1);
    expect(log.body.items[0]).toMatchObject({
      subjectType: 'lab',
      actor: { email: 'admin@calder.test' },
      details: { turnaroundTargetDays: { before: 7, after: 5 }, accreditationNumber: { before: 'DEMO-17025-0412', after: 'DEMO-17025-0413' } },
    });
  });

  it('refuses an empty change, a bad value and another lab’s name, changing nothing', async () => {
    const admin = await t.authFor('lab-admin');
    const empty = await request(t.app).patch('/api/lab/profile').set(admin).send({});
    expect(empty.body.errors).toEqual([{ field: '(root)', message: 'must change at least one field' }]);
    const bad = await request(t.app).patch('/api/lab/profile').set(admin).send({ turnaroundTargetDays: 0 });
    expect(bad.body.errors).toEqual([{ field: 'turnaroundTargetDays', message: 'must be at least 1' }]);
    const taken = await request(t.app).patch('/api/lab/profile').set(admin).send({ name: 'marlow test house' });
    expect(taken.status).toBe(409);
    expect((await request(t.app).get('/api/lab/profile').set(admin)).body.name).toBe('Calder Analytical');
  });

  it('pages the audit log newest first and filters by subject', async () => {
    const admin = await t.authFor('lab-admin');
    await t.signIn('analyst@calder.test');
    await t.signIn('analyst@calder.test');
    const analystId = await t.userIdFor('analyst');
    const res = await request(t.app).get(`/api/lab/audit-events?action=auth.signed-in&subjectId=${analystId}&pageSize=1`).set(admin);
    expect(res.body).toMatchObject({ total: 2, page: 1, pageSize: 1 });
    expect(res.body.items[0].actor.email).toBe('analyst@calder.test');
  });
});
