import jwt from 'jsonwebtoken';
import request from 'supertest';
import { config } from '../../config';
import { AuditEvent } from '../audit/audit-event.entity';
import { RefreshSession } from './refresh-session.entity';
import { DEMO_PASSWORD, useTestApp } from '../../testing';

const t = useTestApp();

function refreshCookie(res: request.Response): string {
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('ohmprint_refresh='));
  if (!cookie) throw new Error('no refresh cookie');
  return cookie;
}

describe('sign-in', () => {
  it('signs a lab analyst in with a token, the user and an httpOnly SameSite=Strict cookie on /api/auth', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'Analyst@Calder.test', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: 'analyst@calder.test', roles: ['analyst'], lab: { name: 'Calder Analytical' }, clientOrganisation: null });
    expect(typeof res.body.accessToken).toBe('string');
    const cookie = refreshCookie(res);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Strict/);
    expect(cookie).toMatch(/Path=\/api\/auth/);
    const me = await request(t.app).get('/api/me').set('Authorization', `Bearer ${res.body.accessToken}`);
    expect(me.status).toBe(200);
    expect(me.body.email).toBe('analyst@calder.test');
  });

  it('gives a client user their organisation and the operator no lab', async () => {
    const client = await t.signIn('member@hollinridge.test');
    expect(client.body.user).toMatchObject({ roles: ['client-member'], clientOrganisation: { name: 'Hollin Ridge Cellars' }, lab: { name: 'Calder Analytical' } });
    const operator = await t.signIn('operator@ohmprint.test');
    expect(operator.body.user).toMatchObject({ roles: ['platform-operator'], lab: null, clientOrganisation: null });
  });

  it('refuses a wrong password with one message for unknown and known e-mails, and audits the failure', async () => {
    const wrong = await request(t.app).post('/api/auth/sign-in').send({ email: 'reviewer@calder.test', password: 'not-the-password' });
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: 'nobody@calder.test', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(wrong.body.detail).toBe(unknown.body.detail);
    expect(wrong.headers['set-cookie']).toBeUndefined();
    expect(await t.db.manager.count(AuditEvent, { where: { action: 'auth.sign-in-failed' } })).toBeGreaterThanOrEqual(2);
  });

  it('reports missing and wrong-typed fields with their names', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 42 });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual(
      expect.arrayContaining([
        { field: 'email', message: expect.any(String) },
        { field: 'password', message: expect.any(String) },
      ]),
    );
    expect(res.body.detail).toMatch(/request body has 2 invalid fields/);
  });

  it('answers malformed JSON with a problem naming the parse error', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email": "a@b.test", ');
    expect(res.status).toBe(400);
    expect(res.body.title).toBe('Malformed JSON');
    expect(res.body.detail).toMatch(/not valid JSON/);
  });

  it('refuses an oversized body with 413', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test', password: 'x'.repeat(300 * 1024) });
    expect(res.status).toBe(413);
    expect(res.body.title).toBe('Request body too large');
  });
});

describe('access tokens', () => {
  it('refuses a missing, tampered, expired, alg:none and HS512 token with 401', async () => {
    const userId = await t.userIdFor('analyst');
    const good = await t.tokenFor('analyst');
    const [h, p, s] = good.split('.');
    const forgedPayload = Buffer.from(JSON.stringify({ ...JSON.parse(Buffer.from(p, 'base64url').toString()), sub: await t.userIdFor('lab-admin') })).toString('base64url');
    const tampered = `${h}.${forgedPayload}.${s}`;
    const expired = jwt.sign({}, config.auth.accessSecret, { algorithm: 'HS256', subject: userId, issuer: 'ohmprint', audience: 'ohmprint-api', expiresIn: -10 });
    const none = `${Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url')}.${p}.`;
    const hs512 = jwt.sign({}, config.auth.accessSecret, { algorithm: 'HS512', subject: userId, issuer: 'ohmprint', audience: 'ohmprint-api', expiresIn: 60 });

    expect((await request(t.app).get('/api/me')).status).toBe(401);
    for (const token of [tampered, none, hs512]) {
      const res = await request(t.app).get('/api/me').set('Authorization', `Bearer ${token}`);
      expect(res.status).toBe(401);
      expect(res.body.detail).toMatch(/not valid/);
    }
    const late = await request(t.app).get('/api/me').set('Authorization', `Bearer ${expired}`);
    expect(late.status).toBe(401);
    expect(late.body.detail).toMatch(/expired/);
  });
});

describe('refresh and sign-out', () => {
  it('rotates the refresh token on every refresh', async () => {
    const { cookie } = await t.signIn('intake@calder.test');
    const first = await request(t.app).post('/api/auth/refresh').set('Cookie', cookie);
    expect(first.status).toBe(200);
    expect(first.body.user.email).toBe('intake@calder.test');
    const next = refreshCookie(first).split(';')[0];
    expect(next).not.toBe(cookie);
    const second = await request(t.app).post('/api/auth/refresh').set('Cookie', next);
    expect(second.status).toBe(200);
  });

  it('revokes the whole family when a rotated refresh token is used again', async () => {
    const { cookie } = await t.signIn('reviewer@calder.test');
    const rotated = await request(t.app).post('/api/auth/refresh').set('Cookie', cookie);
    const current = refreshCookie(rotated).split(';')[0];
    const userId = await t.userIdFor('reviewer');
    // The copy turns up a minute after the owner's refresh: past the grace for concurrent tabs.
    await t.db.query(`UPDATE refresh_session SET rotated_at = rotated_at - interval '1 minute' WHERE user_id = $1 AND rotated_at IS NOT NULL`, [userId]);

    const replay = await request(t.app).post('/api/auth/refresh').set('Cookie', cookie);
    expect(replay.status).toBe(401);
    expect(replay.body.detail).toMatch(/used again/);
    // The legitimate holder's newer token is revoked too: the thief and the owner both sign in again.
    const afterReplay = await request(t.app).post('/api/auth/refresh').set('Cookie', current);
    expect(afterReplay.status).toBe(401);
    const sessions = await t.db.manager.find(RefreshSession, { where: { userId } });
    expect(sessions.every((s) => s.revokedAt !== null)).toBe(true);
    expect(await t.db.manager.count(AuditEvent, { where: { action: 'auth.refresh-token-reused', subjectId: userId } })).toBe(1);
  });

  it('lets two tabs refresh with the same cookie at once without ending the sign-in', async () => {
    const { cookie } = await t.signIn('analyst@calder.test');
    const [a, b] = await Promise.all([
      request(t.app).post('/api/auth/refresh').set('Cookie', cookie),
      request(t.app).post('/api/auth/refresh').set('Cookie', cookie),
    ]);
    expect([a.status, b.status]).toEqual([200, 200]);
    for (const res of [a, b]) {
      expect((await request(t.app).post('/api/auth/refresh').set('Cookie', refreshCookie(res).split(';')[0])).status).toBe(200);
    }
  });

  it('signs out: the cookie is cleared and the refresh token no longer works', async () => {
    const { cookie } = await t.signIn('admin@calder.test');
    const out = await request(t.app).post('/api/auth/sign-out').set('Cookie', cookie);
    expect(out.status).toBe(204);
    expect(String(out.headers['set-cookie'])).toMatch(/ohmprint_refresh=;/);
    const refresh = await request(t.app).post('/api/auth/refresh').set('Cookie', cookie);
    expect(refresh.status).toBe(401);
  });

  it('refuses a refresh without a cookie or with an unknown one', async () => {
    expect((await request(t.app).post('/api/auth/refresh')).status).toBe(401);
    expect((await request(t.app).post('/api/auth/refresh').set('Cookie', 'ohmprint_refresh=made-up-token-value')).status).toBe(401);
  });
});
