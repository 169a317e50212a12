import request from 'supertest';
import { LAB_ROLES, ROLES, type Role } from '@ohmprint/contracts';
import { useTestApp } from '../../testing';

const t = useTestApp();
const SOME_ID = '00000000-0000-4000-8000-000000000000';

interface Rule {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  allowed: Role[];
  /** An allowed caller gets this status (GETs succeed; writes are sent an empty body and stop at validation). */
  allowedStatus: number;
}

const signedIn = [...ROLES];
const RULES: Rule[] = [
  { method: 'get', path: '/api/me', allowed: signedIn, allowedStatus: 200 },
  { method: 'patch', path: '/api/me', allowed: signedIn, allowedStatus: 400 },
  { method: 'post', path: '/api/me/password', allowed: signedIn, allowedStatus: 400 },
  { method: 'get', path: '/api/lab/profile', allowed: [...LAB_ROLES], allowedStatus: 200 },
  { method: 'patch', path: '/api/lab/profile', allowed: ['lab-admin'], allowedStatus: 400 },
  { method: 'get', path: '/api/lab/audit-events', allowed: ['lab-admin'], allowedStatus: 200 },
  { method: 'get', path: '/api/lab/staff', allowed: ['lab-admin'], allowedStatus: 200 },
  { method: 'get', path: '/api/lab/staff/invitations', allowed: ['lab-admin'], allowedStatus: 200 },
  { method: 'post', path: '/api/lab/staff/invitations', allowed: ['lab-admin'], allowedStatus: 400 },
  { method: 'delete', path: `/api/lab/staff/invitations/${SOME_ID}`, allowed: ['lab-admin'], allowedStatus: 404 },
  { method: 'put', path: `/api/lab/staff/${SOME_ID}/roles`, allowed: ['lab-admin'], allowedStatus: 400 },
  { method: 'post', path: `/api/lab/staff/${SOME_ID}/deactivation`, allowed: ['lab-admin'], allowedStatus: 404 },
  { method: 'post', path: `/api/lab/staff/${SOME_ID}/reactivation`, allowed: ['lab-admin'], allowedStatus: 404 },
  { method: 'get', path: '/api/lab/client-organisations', allowed: ['lab-admin'], allowedStatus: 200 },
  { method: 'get', path: `/api/lab/client-organisations/${SOME_ID}`, allowed: ['lab-admin'], allowedStatus: 404 },
  { method: 'post', path: '/api/lab/client-organisations', allowed: ['lab-admin'], allowedStatus: 400 },
  { method: 'get', path: '/api/operator/labs', allowed: ['platform-operator'], allowedStatus: 200 },
  { method: 'get', path: `/api/operator/labs/${SOME_ID}`, allowed: ['platform-operator'], allowedStatus: 404 },
  { method: 'post', path: '/api/operator/labs', allowed: ['platform-operator'], allowedStatus: 400 },
  { method: 'patch', path: `/api/operator/labs/${SOME_ID}`, allowed: ['platform-operator'], allowedStatus: 400 },
  { method: 'get', path: '/api/client/team', allowed: ['client-admin', 'client-member'], allowedStatus: 200 },
  { method: 'get', path: '/api/client/team/invitations', allowed: ['client-admin'], allowedStatus: 200 },
  { method: 'post', path: '/api/client/team/invitations', allowed: ['client-admin'], allowedStatus: 400 },
  { method: 'delete', path: `/api/client/team/invitations/${SOME_ID}`, allowed: ['client-admin'], allowedStatus: 404 },
  { method: 'delete', path: `/api/client/team/${SOME_ID}`, allowed: ['client-admin'], allowedStatus: 404 },
];

describe('every route checks sign-in and role', () => {
  it.each(RULES.map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s refuses an anonymous caller', async (_name, rule) => {
    const res = await request(t.app)[rule.method](rule.path).send({});
    expect(res.status).toBe(401);
  });

  it.each(RULES.map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s admits exactly its roles', async (_name, rule) => {
    for (const role of ROLES) {
      const res = await request(t.app)[rule.method](rule.path).set(await t.authFor(role)).send({});
      const expected = rule.allowed.includes(role) ? rule.allowedStatus : 403;
      expect({ role, status: res.status }).toEqual({ role, status: expected });
    }
  });
});

describe('a user of another lab sees nothing of this one', () => {
  it('gets 404 for this lab’s staff member and client organisation, and changes nothing', async () => {
    const marlowAdmin = await t.authFor('lab-admin', 'marlow');
    const calderAnalyst = await t.userIdFor('analyst');
    const orgs = await request(t.app).get('/api/lab/client-organisations').set(await t.authFor('lab-admin'));
    const calderOrg = orgs.body.items[0].id as string;

    expect((await request(t.app).put(`/api/lab/staff/${calderAnalyst}/roles`).set(marlowAdmin).send({ roles: ['lab-admin'] })).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/staff/${calderAnalyst}/deactivation`).set(marlowAdmin)).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/staff/${calderAnalyst}/reactivation`).set(marlowAdmin)).status).toBe(404);
    expect((await request(t.app).get(`/api/lab/client-organisations/${calderOrg}`).set(marlowAdmin)).status).toBe(404);

    const me = await request(t.app).get('/api/me').set(await t.authFor('analyst'));
    expect(me.body.roles).toEqual(['analyst']);
  });

  it('lists only its own staff, organisations and invitations', async () => {
    const marlowAdmin = await t.authFor('lab-admin', 'marlow');
    await request(t.app).post('/api/lab/staff/invitations').set(await t.authFor('lab-admin')).send({ email: 'calder-only@calder.test', roles: ['analyst'] }).expect(201);

    const staff = await request(t.app).get('/api/lab/staff?pageSize=100').set(marlowAdmin);
    expect(staff.body.items.length).toBe(4);
    expect(staff.body.items.every((s: { email: string }) => s.email.endsWith('@marlow.test'))).toBe(true);
    const searched = await request(t.app).get('/api/lab/staff?q=calder').set(marlowAdmin);
    expect(searched.body).toEqual({ items: [], total: 0, page: 1, pageSize: 20 });

    const orgs = await request(t.app).get('/api/lab/client-organisations').set(marlowAdmin);
    expect(orgs.body.items.map((o: { name: string }) => o.name)).toEqual(['Greyfield Preserves']);
    const invitations = await request(t.app).get('/api/lab/staff/invitations').set(marlowAdmin);
    expect(invitations.body.total).toBe(0);
    const audit = await request(t.app).get('/api/lab/audit-events?action=invitation.sent').set(marlowAdmin);
    expect(audit.body.total).toBe(0);
    const profile = await request(t.app).get('/api/lab/profile').set(marlowAdmin);
    expect(profile.body.name).toBe('Marlow Test House');
  });

  it('keeps a client user to their own organisation, even within the same lab', async () => {
    const hollinAdmin = await t.authFor('client-admin');
    const team = await request(t.app).get('/api/client/team').set(hollinAdmin);
    expect(team.body.items.map((m: { email: string }) => m.email).sort()).toEqual(['admin@hollinridge.test', 'member@hollinridge.test']);

    const brightwaterMember = (await t.db.query(`SELECT id FROM app_user WHERE email = 'member@brightwater.test'`))[0].id;
    expect((await request(t.app).delete(`/api/client/team/${brightwaterMember}`).set(hollinAdmin)).status).toBe(404);
    const greyfieldMember = await t.userIdFor('client-member', 'marlow');
    expect((await request(t.app).delete(`/api/client/team/${greyfieldMember}`).set(hollinAdmin)).status).toBe(404);
    const still = await request(t.app).post('/api/auth/sign-in').send({ email: 'member@brightwater.test', password: 'ohmprint-demo-2026' });
    expect(still.status).toBe(200);
  });
});
