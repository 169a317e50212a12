import express from 'express';
import request from 'supertest';
import { QueryFailedError } from 'typeorm';
import { useTestApp } from '../testing';
import { withMaintenanceConnection } from '../testing/maintenance-db';
import { errorMiddleware } from './error-middleware';

const t = useTestApp();

const LIST_ROUTES = ['/api/lab/samples', '/api/lab/staff', '/api/lab/client-organisations', '/api/operator/labs'];

describe('text PostgreSQL cannot store', () => {
  it('answers a NUL byte in an unauthenticated sign-in with 400 naming the field', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'analyst@calder.test\u0000', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.type).toBe('urn:ohmprint:problem:invalid-text');
    expect(res.body.errors).toEqual([{ field: 'email', message: 'must not contain a NUL character (\\u0000)' }]);
  });

  it('answers a NUL byte in ?q= of list routes with 400 naming q', async () => {
    const auth = { 'platform-operator': await t.authFor('platform-operator'), 'lab-admin': await t.authFor('lab-admin') };
    for (const path of LIST_ROUTES) {
      const res = await request(t.app)
        .get(`${path}?q=ab%00cd`)
        .set(path.startsWith('/api/operator') ? auth['platform-operator'] : auth['lab-admin']);
      expect([path, res.status, res.body.errors]).toEqual([path, 400, [{ field: 'q', message: expect.stringMatching(/NUL/) }]]);
    }
  });

  it('answers a lone surrogate in a JSON body with 400 naming the nested field', async () => {
    const res = await request(t.app)
      .patch('/api/me')
      .set(await t.authFor('analyst'))
      .set('Content-Type', 'application/json')
      .send('{"displayName":"Ana \\ud800 Lyst"}');
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'displayName', message: expect.stringMatching(/unpaired UTF-16 surrogate/) }]);
  });

  it('refuses an e-mail address of several kilobytes as too long, not with a 500', async () => {
    const email = `${'a'.repeat(3000)}@calder.test`;
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email, password: 'whatever-it-is' });
    expect(signIn.status).toBe(400);
    expect(signIn.body.errors).toEqual([{ field: 'email', message: expect.stringMatching(/at most 254 characters/) }]);
    const invite = await request(t.app).post('/api/lab/staff/invitations').set(await t.authFor('lab-admin')).send({ email, roles: ['analyst'] });
    expect(invite.status).toBe(400);
  });
});

describe('errors from the database', () => {
  it('never echoes the database’s message to the caller: it is logged, the caller gets the request id', async () => {
    const app = express();
    app.get('/boom', () => {
      throw new QueryFailedError('SELECT secret_column FROM hidden_table', [], new Error('relation "hidden_table" does not exist'));
    });
    app.use(errorMiddleware);
    const res = await request(app).get('/boom');
    expect(res.status).toBe(500);
    expect(JSON.stringify(res.body)).not.toMatch(/hidden_table|secret_column/);
    expect(res.body.detail).toMatch(/Quote request id/);
  });

  it('answers 503 with Retry-After while the database refuses connections, and works again after', async () => {
    const auth = await t.authFor('lab-admin');
    expect((await request(t.app).get('/api/lab/samples').set(auth)).status).toBe(200);
    const db = t.databaseName;
    await withMaintenanceConnection(async (c) => {
      await c.query(`ALTER DATABASE "${db}" ALLOW_CONNECTIONS false`);
      await c.query('SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1', [db]);
    });
    try {
      const down = await request(t.app).get('/api/lab/samples').set(auth);
      expect(down.status).toBe(503);
      expect(down.headers['retry-after']).toBe('5');
      expect(down.body.type).toBe('urn:ohmprint:problem:service-unavailable');
      expect(JSON.stringify(down.body)).not.toContain(db);
    } finally {
      await withMaintenanceConnection((c) => c.query(`ALTER DATABASE "${db}" ALLOW_CONNECTIONS true`));
    }
    expect((await request(t.app).get('/api/lab/samples').set(auth)).status).toBe(200);
  });
});
