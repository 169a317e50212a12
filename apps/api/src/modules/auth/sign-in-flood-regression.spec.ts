import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { createApp } from '../../app';
import { config } from '../../config';
import { useTestApp } from '../../testing';
import { probeOffThread } from '../../testing/off-thread-probe';

/**
 * Issue 10, "Sign-in flood" and "All limits can be bypassed with X-Forwarded-For": the parts of
 * the sign-in limits no other test reaches — the proxy setting, when a lab turns it on, keys each
 * limit on the forwarded address; guessing one account from many addresses stops at the
 * per-account limit; a platform-wide limit bounds all attempts; and checking a password never
 * holds the event loop (a production-cost hash, checked in the worker pool while health answers).
 */
jest.setTimeout(120_000);

// Small limits for this file, set before its first sign-in builds the limiters.
const auth = config.auth as { signInMaxFailuresPerAddress: number; signInMaxFailuresPerAccount: number; signInGlobalPerMinute: number };
auth.signInMaxFailuresPerAddress = 8;
auth.signInMaxFailuresPerAccount = 12;
auth.signInGlobalPerMinute = 40;

const t = useTestApp();
const clearLimits = () => t.db.query(`DELETE FROM rate_limit_window WHERE key LIKE 'sign-in%'`);

/** The app as a lab behind one reverse proxy on this machine would run it (TRUST_PROXY=loopback). */
function proxiedApp() {
  const before = config.trustProxy;
  (config as { trustProxy: typeof before }).trustProxy = 'loopback';
  try {
    return createApp();
  } finally {
    (config as { trustProxy: typeof before }).trustProxy = before;
  }
}

const signIn = (app: ReturnType<typeof createApp>, from: string, email: string, password = 'not-the-password') =>
  request(app).post('/api/auth/sign-in').set('X-Forwarded-For', from).send({ email, password });

describe('sign-in limits behind a trusted proxy', () => {
  beforeEach(clearLimits);

  it('counts failures per forwarded address: one address flooding random e-mails is stopped, another address is not', async () => {
    const app = proxiedApp();
    const flood: number[] = [];
    for (let i = 0; i < auth.signInMaxFailuresPerAddress + 2; i++) flood.push((await signIn(app, '198.51.100.7', `nobody-${randomUUID()}@flood.test`)).status);
    expect(flood).toEqual([...Array(auth.signInMaxFailuresPerAddress).fill(401), 429, 429]);
    const blocked = await signIn(app, '198.51.100.7', `nobody-${randomUUID()}@flood.test`);
    expect(blocked.body.detail).toMatch(/from this network address/);
    expect((await signIn(app, '198.51.100.8', `nobody-${randomUUID()}@flood.test`)).status).toBe(401);
  });

  it('stops guessing one account spread over many addresses at the per-account limit', async () => {
    const app = proxiedApp();
    const statuses: number[] = [];
    for (let i = 0; i < auth.signInMaxFailuresPerAccount + 2; i++) statuses.push((await signIn(app, `203.0.113.${i + 1}`, 'reviewer@calder.test')).status);
    expect(statuses).toEqual([...Array(auth.signInMaxFailuresPerAccount).fill(401), 429, 429]);
    const refused = await signIn(app, '203.0.113.200', 'reviewer@calder.test');
    expect(refused.body.detail).toMatch(/for this account/);
  });

  it('bounds all sign-in attempts platform-wide, whatever the address and the e-mail', async () => {
    const app = proxiedApp();
    const statuses: number[] = [];
    for (let i = 0; i < auth.signInGlobalPerMinute + 3; i++) statuses.push((await signIn(app, `192.0.2.${i + 1}`, `nobody-${randomUUID()}@spread.test`)).status);
    expect(statuses.slice(0, auth.signInGlobalPerMinute).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(auth.signInGlobalPerMinute)).toEqual([429, 429, 429]);
    const busy = await signIn(app, '192.0.2.250', `nobody-${randomUUID()}@spread.test`);
    expect(busy.body.title).toBe('Sign-in busy');
    expect(busy.headers['retry-after']).toBe('60');
  });
});

describe('checking a password', () => {
  beforeEach(clearLimits);

  it('runs in the worker pool at production cost while the API keeps answering health', async () => {
    // Cost 12, as BCRYPT_COST defaults to outside tests: a quarter of a second or more of CPU.
    await t.db.query(`UPDATE app_user SET password_hash = $1 WHERE email = 'intake@calder.test'`, [bcrypt.hashSync('a production-cost passphrase', 12)]);
    const probe = await probeOffThread(t.app, 'verifyPassword', () =>
      request(t.app).post('/api/auth/sign-in').send({ email: 'intake@calder.test', password: 'a production-cost passphrase' }));
    expect(probe.result.status).toBe(200);
    expect(probe.tasks).toBe(1);
    expect(probe.healthAnswersDuringTask).toBeGreaterThanOrEqual(1);
    // generous for a loaded two-core machine: on the event loop the whole hash would be one stall
    expect(probe.maxStallMs).toBeLessThan(1500);
  });
});
