import request from 'supertest';
import { createApp } from '../../app';
import { useTestApp } from '../../testing';

const t = useTestApp();

describe('my account', () => {
  it('changes my display name', async () => {
    const auth = await t.authFor('analyst');
    const res = await request(t.app).patch('/api/me').set(auth).send({ displayName: '  Ana L. Yst  ' });
    expect(res.status).toBe(200);
    expect(res.body.displayName).toBe('Ana L. Yst');
    expect((await request(t.app).get('/api/me').set(auth)).body.displayName).toBe('Ana L. Yst');
  });

  it('refuses an empty display name and keeps the old one', async () => {
    const auth = await t.authFor('reviewer');
    const res = await request(t.app).patch('/api/me').set(auth).send({ displayName: '   ' });
    expect(res.body.errors).toEqual([{ field: 'displayName', message: 'must not be empty' }]);
    expect((await request(t.app).get('/api/me').set(auth)).body.displayName).toBe('Rae Viewer (demo)');
  });

  it('changes my password: other sign-ins end, this one gets a fresh session', async () => {
    const other = await t.signIn('member@brightwater.test');
    const here = await t.signIn('member@brightwater.test');
    const res = await request(t.app)
      .post('/api/me/password')
      .set('Authorization', `Bearer ${here.body.accessToken}`)
      .send({ currentPassword: 'ohmprint-demo-2026', newPassword: 'milk-and-more-milk' });
    expect(res.status).toBe(200);
    expect(String(res.headers['set-cookie'])).toMatch(/ohmprint_refresh=.+; Path=\/api\/auth/);
    expect((await request(t.app).post('/api/auth/refresh').set('Cookie', other.cookie)).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'member@brightwater.test', password: 'milk-and-more-milk' })).status).toBe(200);
  });

  it('refuses a wrong current password and changes nothing', async () => {
    const auth = await t.authFor('client-admin');
    const res = await request(t.app).post('/api/me/password').set(auth).send({ currentPassword: 'wrong-one', newPassword: 'whatever-long-enough' });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'currentPassword', message: 'is not correct' }]);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'admin@hollinridge.test', password: 'ohmprint-demo-2026' })).status).toBe(200);
  });
});

describe('client team removal', () => {
  it('a client admin removes a colleague, whose account can no longer sign in; removing yourself is refused', async () => {
    const admin = await t.authFor('client-admin');
    const memberId = await t.userIdFor('client-member');
    expect((await request(t.app).delete(`/api/client/team/${await t.userIdFor('client-admin')}`).set(admin)).status).toBe(409);
    expect((await request(t.app).delete(`/api/client/team/${memberId}`).set(admin)).status).toBe(204);
    const team = await request(t.app).get('/api/client/team').set(admin);
    expect(team.body.items.map((m: { email: string }) => m.email)).toEqual(['admin@hollinridge.test']);
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: 'member@hollinridge.test', password: 'ohmprint-demo-2026' });
    expect(signIn.status).toBe(403);
  });
});

describe('sign-in rate limit', () => {
  it('refuses further attempts for an address after repeated failures, with a clear 429', async () => {
    const attempt = () => request(t.app).post('/api/auth/sign-in').send({ email: 'intake@calder.test', password: 'guess-guess-guess' });
    for (let i = 0; i < 10; i++) expect((await attempt()).status).toBe(401);
    const blocked = await attempt();
    expect(blocked.status).toBe(429);
    expect(blocked.body.title).toBe('Too many failed sign-ins');
    // Other addresses from the same client are not affected.
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: 'ohmprint-demo-2026' })).status).toBe(200);
  });
});

describe('sign-in rate limit across API processes', () => {
  it('counts failures on every process together, since the counts live in PostgreSQL', async () => {
    // two apps built apart, as two processes behind a load balancer would be
    const [first, second] = [createApp(), createApp()];
    const attempt = (app: typeof first) => request(app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: 'guess-guess-guess' });
    for (let i = 0; i < 10; i++) expect((await attempt(i % 2 === 0 ? first : second)).status).toBe(401);
    expect((await attempt(first)).status).toBe(429);
    expect((await attempt(second)).status).toBe(429);
  });
});
