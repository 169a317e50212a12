import { request as httpRequest, type ClientRequest, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { useTestApp } from '../../testing';
import { MAX_CONCURRENT_UPLOADS } from './verification.router';

const t = useTestApp();
let server: Server;
let port: number;

beforeAll(async () => {
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as AddressInfo).port;
});
afterAll(() => new Promise((r) => server.close(r)));

const BOUNDARY = 'ohmprint-test-boundary';

/** An upload whose body is still arriving: headers and the first bytes sent, the rest held back. */
function slowUpload(): ClientRequest {
  const req = httpRequest({ host: '127.0.0.1', port, method: 'POST', path: '/api/public/verify/upload', headers: { 'content-type': `multipart/form-data; boundary=${BOUNDARY}`, 'content-length': String(10 * 1048576) } });
  req.on('error', () => undefined);
  req.write(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.7\n`);
  return req;
}

describe('anonymous PDF checks', () => {
  it('handles a limited number of uploads at once and refuses the next with 429 naming the limit', async () => {
    await t.db.query(`DELETE FROM rate_limit_window WHERE key LIKE 'verify:%'`);
    const hanging = Array.from({ length: MAX_CONCURRENT_UPLOADS }, slowUpload);
    try {
      // Wait until the slow uploads have reached the route.
      await new Promise((r) => setTimeout(r, 1500));
      const refused = await request(server).post('/api/public/verify/upload').attach('file', Buffer.from('%PDF-1.7\n%%EOF\n'), 'small.pdf');
      expect(refused.status).toBe(429);
      expect(refused.body.type).toBe('urn:ohmprint:problem:too-many-concurrent');
      expect(refused.body.detail).toContain(`At most ${MAX_CONCURRENT_UPLOADS} uploaded PDF checks`);
      expect(refused.headers['retry-after']).toBe('2');
    } finally {
      for (const req of hanging) req.destroy();
    }
    // Once they are gone, an upload is handled again (an unknown PDF: not a 429).
    await new Promise((r) => setTimeout(r, 500));
    const after = await request(server).post('/api/public/verify/upload').attach('file', Buffer.from('%PDF-1.7\n%%EOF\n'), 'small.pdf');
    expect(after.status).not.toBe(429);
  });
});
