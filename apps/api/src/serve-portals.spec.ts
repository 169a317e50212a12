import express from 'express';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { errorMiddleware } from './core/error-middleware';
import { servePortals } from './serve-portals';

describe('serving the built portals', () => {
  let dist: string;
  beforeAll(() => {
    dist = mkdtempSync(join(tmpdir(), 'ohmprint-portals-'));
    for (const [name, title] of [['client-portal', 'client'], ['lab-portal', 'lab']]) {
      mkdirSync(join(dist, name, 'browser'), { recursive: true });
      writeFileSync(join(dist, name, 'browser', 'index.html'), `<title>${title}</title>`);
      writeFileSync(join(dist, name, 'browser', 'main.js'), `console.log('${title}')`);
    }
  });
  afterAll(() => rmSync(dist, { recursive: true, force: true }));

  it('serves each portal’s files and falls back to its index.html for deep links', async () => {
    const app = express();
    expect(servePortals(app, dist)).toEqual(['/lab', '/']);
    expect((await request(app).get('/main.js')).text).toBe("console.log('client')");
    expect((await request(app).get('/lab/main.js')).text).toBe("console.log('lab')");
    expect((await request(app).get('/verify')).text).toBe('<title>client</title>');
    expect((await request(app).get('/reset-password?token=abc')).text).toBe('<title>client</title>');
    expect((await request(app).get('/lab/queue/42')).text).toBe('<title>lab</title>');
    expect((await request(app).get('/lab/')).text).toBe('<title>lab</title>');
  });

  it('caches content-hashed bundles for good and revalidates everything else', async () => {
    writeFileSync(join(dist, 'client-portal', 'browser', 'main-ABCD1234.js'), 'console.log(1)');
    const app = express();
    servePortals(app, dist);
    expect((await request(app).get('/main-ABCD1234.js')).headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect((await request(app).get('/main.js')).headers['cache-control']).toBe('no-cache');
    expect((await request(app).get('/orders')).headers['cache-control']).toBe('no-cache');
  });

  it('answers 404 (not 500) when a portal build disappears while the API runs', async () => {
    const app = express();
    servePortals(app, dist);
    app.use(errorMiddleware);
    rmSync(join(dist, 'client-portal', 'browser', 'index.html'));
    const res = await request(app).get('/orders');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    writeFileSync(join(dist, 'client-portal', 'browser', 'index.html'), '<title>client</title>');
  });

  it('serves nothing when a portal has not been built', async () => {
    rmSync(join(dist, 'lab-portal'), { recursive: true });
    const app = express();
    expect(servePortals(app, dist)).toEqual(['/']);
  });
});
