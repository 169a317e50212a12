import request from 'supertest';
import { useTestApp } from '../../testing';

const t = useTestApp();

describe('GET /api/health', () => {
  it('reports the database as reachable', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'ok' });
  });

  it('carries a request id and a self-only content security policy', async () => {
    const res = await request(t.app).get('/api/health').set('X-Request-Id', 'trace-12345678');
    expect(res.headers['x-request-id']).toBe('trace-12345678');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['content-security-policy']).toContain("font-src 'self'");
  });

  it('answers an unknown API path with a problem, not an HTML page', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.detail).toBe('There is no GET /api/no-such-thing in this API.');
  });

  it('answers 503 with the database marked unreachable when it cannot be reached', async () => {
    await t.db.destroy();
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ status: 'degraded', database: 'unreachable' });
  });
});
