import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { config } from '../../config';
import { DEMO_PASSWORD, latestEmailTo, linkToken, useTestApp } from '../../testing';
import { signAccessToken } from './access-token';

const t = useTestApp();

const clearLimits = () => t.db.query(`DELETE FROM rate_limit_window WHERE key LIKE 'sign-in%' OR key LIKE 'password-change:%'`);
const refreshCookie = (res: request.Response): string =>
  ([] as string[])
    .concat(res.headers['set-cookie'] ?? [])
    .find((c) => c.startsWith('ohmprint_refresh='))!
    .split(';')[0];

describe('sign-in limits', () => {
  beforeEach(clearLimits);

  it('throttles a flood of random e-mails from one address, whatever X-Forwarded-For says', async () => {
    const limit = config.auth.signInMaxFailuresPerAddress;
    const statuses: number[] = [];
    for (let i = 0; i < limit + 3; i++) {
      const res = await request(t.app)
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', `203.0.113.${i}`)
        .send({ email: `nobody-${randomUUID()}@flood.test`, password: 'guess-guess' });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, limit).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(limit)).toEqual([429, 429, 429]);
    const refused = await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: DEMO_PASSWORD });
    expect(refused.status).toBe(429);
    expect(refused.body.detail).toMatch(/from this network address/);
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
  });

  it('lets forty correct sign-ins of one account at once all through', async () => {
    const all = await Promise.all(Array.from({ length: 40 }, () => request(t.app).post('/api/auth/sign-in').send({ email: 'intake@calder.test', password: DEMO_PASSWORD })));
    expect(all.map((r) => r.status)).toEqual(Array(40).fill(200));
  });

  it('stops guessing the current password on the change-password form after the limit', async () => {
    const { body } = await t.signIn('reviewer@calder.test');
    const auth = { Authorization: `Bearer ${body.accessToken}` };
    for (let i = 0; i < config.auth.signInMaxFailures; i++) {
      const wrong = await request(t.app).post('/api/me/password').set(auth).send({ currentPassword: `wrong-${i}`, newPassword: 'a-brand-new-passphrase' });
      expect(wrong.status).toBe(400);
    }
    const blocked = await request(t.app).post('/api/me/password').set(auth).send({ currentPassword: DEMO_PASSWORD, newPassword: 'a-brand-new-passphrase' });
    expect(blocked.status).toBe(429);
    expect(blocked.body.detail).toMatch(/wrong current passwords/);
  });
});

describe('access tokens end with their sign-in', () => {
  it('stop working at once after a password reset', async () => {
    const { body } = await t.signIn('member@sunvale.test');
    const auth = { Authorization: `Bearer ${body.accessToken}` };
    // A token minted without a sign-in (as tests and tools do) carries the token version too.
    const minted = { Authorization: `Bearer ${signAccessToken(body.user.id)}` };
    expect((await request(t.app).get('/api/me').set(auth)).status).toBe(200);
    await request(t.app).post('/api/auth/password-reset-requests').send({ email: 'member@sunvale.test' }).expect(202);
    const { token } = linkToken((await latestEmailTo(t.db, 'member@sunvale.test')).text);
    await request(t.app).post('/api/auth/password-resets').send({ token, newPassword: 'a-fresh-passphrase-1' }).expect(204);
    for (const old of [auth, minted]) {
      const res = await request(t.app).get('/api/me').set(old);
      expect(res.status).toBe(401);
      expect(res.body.detail).toMatch(/changed or reset/);
    }
    const fresh = await t.signIn('member@sunvale.test', 'a-fresh-passphrase-1');
    expect((await request(t.app).get('/api/me').set({ Authorization: `Bearer ${fresh.body.accessToken}` })).status).toBe(200);
  });

  it('stop working at once when reuse of a refresh token revokes the sign-in', async () => {
    const { body, cookie } = await t.signIn('analyst@calder.test');
    const rotated = await request(t.app).post('/api/auth/refresh').set('Cookie', cookie);
    const newer = { Authorization: `Bearer ${rotated.body.accessToken}` };
    const older = { Authorization: `Bearer ${body.accessToken}` };
    expect((await request(t.app).get('/api/me').set(newer)).status).toBe(200);
    await t.db.query(`UPDATE refresh_session SET rotated_at = rotated_at - interval '1 minute' WHERE rotated_at IS NOT NULL`);
    expect((await request(t.app).post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(401);
    for (const old of [older, newer]) {
      const res = await request(t.app).get('/api/me').set(old);
      expect(res.status).toBe(401);
      expect(res.body.detail).toMatch(/sign-in has ended/);
    }
    // Another sign-in of the same person is not touched.
    const other = await t.signIn('analyst@calder.test');
    expect((await request(t.app).get('/api/me').set({ Authorization: `Bearer ${other.body.accessToken}` })).status).toBe(200);
    expect(refreshCookie(rotated)).toMatch(/^ohmprint_refresh=/);
  });
});
