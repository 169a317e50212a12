import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { get, type IncomingHttpHeaders } from 'node:http';
import { gunzipSync } from 'node:zlib';
import request from 'supertest';
import { createApp } from './app';
import { config } from './config';

/**
 * Issue 10, "the portals' static files are served without compression ... hashed assets should be
 * cached for good": through the whole app as `main.ts` serves it (middleware order included), a
 * portal's bundle goes out gzip-compressed to a browser that accepts it, hashed bundles are cached
 * for good and index.html is revalidated.
 */
describe('the portals over the wire', () => {
  let dist: string;
  let app: ReturnType<typeof createApp>;
  // A bundle the size and shape of real minified code (repetitive text compresses well).
  const bundle = Array.from({ length: 4000 }, (_, i) => `function f${i}(a){return a.map(x=>x*${i}).filter(Boolean)}`).join(';');

  beforeAll(() => {
    dist = mkdtempSync(join(tmpdir(), 'ohmprint-wire-'));
    for (const name of ['client-portal', 'lab-portal']) {
      mkdirSync(join(dist, name, 'browser'), { recursive: true });
      writeFileSync(join(dist, name, 'browser', 'index.html'), `<!doctype html><title>${name}</title>${'<link rel="modulepreload" href="chunk.js">'.repeat(60)}`);
      writeFileSync(join(dist, name, 'browser', 'main-Q7RZ2K4D.js'), bundle);
      writeFileSync(join(dist, name, 'browser', 'styles-ABCD1234.css'), `.a{color:red}`.repeat(500));
    }
    const before = config.portalsDir;
    (config as { portalsDir: string }).portalsDir = dist;
    try {
      app = createApp();
    } finally {
      (config as { portalsDir: string }).portalsDir = before;
    }
  });
  afterAll(() => rmSync(dist, { recursive: true, force: true }));

  /** The bytes as they travel (node's http client does not unpack them), with the headers. */
  function onTheWire(path: string, acceptEncoding: string): Promise<{ headers: IncomingHttpHeaders; bytes: Buffer }> {
    return new Promise((done, fail) => {
      const server = app.listen(0, '127.0.0.1', () => {
        const { port } = server.address() as { port: number };
        get({ host: '127.0.0.1', port, path, headers: { 'Accept-Encoding': acceptEncoding } }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => server.close(() => done({ headers: res.headers, bytes: Buffer.concat(chunks) })));
        }).on('error', (err) => server.close(() => fail(err)));
      });
    });
  }

  it('sends hashed bundles gzip-compressed and cached for good: a fraction of the bytes, the same file once unpacked', async () => {
    for (const path of ['/main-Q7RZ2K4D.js', '/lab/main-Q7RZ2K4D.js', '/lab/styles-ABCD1234.css']) {
      const res = await request(app).get(path).set('Accept-Encoding', 'gzip, deflate, br');
      expect([path, res.status, res.headers['content-encoding'], res.headers['cache-control']]).toEqual([path, 200, expect.stringMatching(/^(gzip|br|deflate)$/), 'public, max-age=31536000, immutable']);
      expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    }
    const { headers, bytes } = await onTheWire('/lab/main-Q7RZ2K4D.js', 'gzip');
    expect(headers['content-encoding']).toBe('gzip');
    expect(bytes.length).toBeLessThan(bundle.length / 4);
    expect(gunzipSync(bytes).toString()).toBe(bundle);
  });

  it('revalidates index.html and deep links (a new build reaches every user), compressed too', async () => {
    for (const path of ['/lab/', '/lab/queue/42', '/orders']) {
      const res = await request(app).get(path).set('Accept-Encoding', 'gzip');
      expect([path, res.status, res.headers['cache-control'], res.headers['content-encoding']]).toEqual([path, 200, 'no-cache', 'gzip']);
    }
  });

  it('leaves a browser that does not accept compression the plain file', async () => {
    const res = await request(app).get('/main-Q7RZ2K4D.js').set('Accept-Encoding', 'identity');
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.text).toBe(bundle);
  });
});
