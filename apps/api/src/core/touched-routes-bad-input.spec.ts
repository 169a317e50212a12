import request from 'supertest';
import { seedLabDemo } from '../../../../docker-free-scripts/seed/lab-demo';
import { useTestApp } from '../testing';
import { DEFAULT_METHOD } from '../modules/libraries/default-method';
import { createSelfSignedCredential } from '../modules/reports/signing/self-signed-credential';

jest.setTimeout(120_000);
const t = useTestApp();
let bench: { instrumentId: string; cellId: string };

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const res = await request(t.app).get('/api/lab/bench').set(await t.authFor('analyst'));
  bench = { instrumentId: res.body.instruments[0].id, cellId: res.body.cells[0].id };
});

const LONE = '\uD800';
/** Long, but under the JSON body limit, so the field's own check answers. */
const HUGE = 'a'.repeat(200_000);

/** Every answer is a 4xx problem naming a field, never a 500. */
function expectNamed(res: request.Response, field: RegExp): void {
  expect([res.status, res.body.errors?.map((e: { field: string }) => e.field)]).toEqual([expect.any(Number), expect.arrayContaining([expect.stringMatching(field)])]);
  expect(res.status).toBeGreaterThanOrEqual(400);
  expect(res.status).toBeLessThan(500);
}

describe('bad input on the routes moved off the event loop', () => {
  it('staff invitations: NUL, lone surrogate and huge e-mail addresses', async () => {
    const admin = await t.authFor('lab-admin');
    for (const email of [`a\u0000b@calder.test`, `a${LONE}@calder.test`, `${HUGE}@calder.test`]) {
      expectNamed(await request(t.app).post('/api/lab/staff/invitations').set(admin).send({ email, roles: ['analyst'] }), /^email$/);
    }
  });

  it('signing credential: NUL, lone surrogate and huge passphrases, and a file that is not PKCS#12', async () => {
    const admin = await t.authFor('lab-admin');
    const p12 = createSelfSignedCredential({ labName: 'Bad input (test)', passphrase: 'right' });
    for (const passphrase of ['ri\u0000ght', `ri${LONE}ght`, 'x'.repeat(20_000)]) {
      expectNamed(await request(t.app).post('/api/lab/signing-credential').set(admin).field('passphrase', passphrase).attach('file', p12, 'signing.p12'), /passphrase/);
    }
    expectNamed(await request(t.app).post('/api/lab/signing-credential').set(admin).field('passphrase', 'right').attach('file', Buffer.from('\u0000'.repeat(5000)), 'signing.p12'), /file/);
  });

  it('model preview: a replicate id that is not one, and settings with NUL or huge text', async () => {
    const admin = await t.authFor('lab-admin');
    expectNamed(await request(t.app).post('/api/lab/methods/model-preview').set(admin).send({ replicateId: 'x\u0000', settings: DEFAULT_METHOD }), /replicateId/);
    expectNamed(await request(t.app).post('/api/lab/methods/model-preview').set(admin).send({ replicateId: '00000000-0000-4000-8000-000000000000', settings: { ...DEFAULT_METHOD, model: `cole${LONE}` } }), /model/);
    expectNamed(await request(t.app).post('/api/lab/methods/model-preview').set(admin).send({ replicateId: '00000000-0000-4000-8000-000000000000', settings: { ...DEFAULT_METHOD, model: HUGE } }), /model/);
  });

  it('measurement upload: files of NUL bytes, lone surrogates and a file name with NUL', async () => {
    const analyst = await t.authFor('analyst');
    const post = () => request(t.app).post('/api/lab/samples/OP-7K3M-Q9/measurements').set(analyst).field('instrumentId', bench.instrumentId).field('cellId', bench.cellId).field('cellConstantSource', 'latest-calibration').field('temperatureC', '22');
    expectNamed(await post().attach('files', Buffer.alloc(4000), 'nul.csv'), /files/);
    expectNamed(await post().attach('files', Buffer.from(`Frequency (Hz);Z' (Ω);Z'' (Ω)\n1000;1${LONE}20;-30\n`, 'utf8'), 'lone.csv'), /files/);
    const named = await post().attach('files', Buffer.from(`Frequency (Hz);Z' (Ω);Z'' (Ω)\n1000;120;-30\n`), 'a\u0000b.csv');
    // Refused by the file-name check, or earlier by the multipart parser: a 400 either way.
    expectNamed(named, /^files\[0\]$|^\(body\)$/);
    expectNamed(await post().attach('files', Buffer.from(`Frequency (Hz);Z' (Ω);Z'' (Ω)\n1000;120;-30\n`), `${'n'.repeat(260)}.csv`), /^files\[0\]$|^\(body\)$/);
    // A name so long that its part header passes the multipart parser's own limit.
    expectNamed(await post().attach('files', Buffer.from(`Frequency (Hz);Z' (Ω);Z'' (Ω)\n1000;120;-30\n`), `${'n'.repeat(90_000)}.csv`), /\(body\)/);
  });

  it('label pack and validation downloads: ids that are not ids', async () => {
    expectNamed(await request(t.app).get(`/api/client/orders/x%00y/label-pack`).set(await t.authFor('client-member')), /path/);
    expectNamed(await request(t.app).get(`/api/lab/validation/library-versions/not-a-version/summary.pdf`).set(await t.authFor('lab-admin')), /id/);
    // A lone surrogate written as UTF-8 bytes is not text at all: refused, never a 500.
    const lone = await request(t.app).get(`/api/lab/validation/library-versions/%ED%A0%80/summary.pdf`).set(await t.authFor('lab-admin'));
    expect(lone.status).toBeGreaterThanOrEqual(400);
    expect(lone.status).toBeLessThan(500);
    expectNamed(await request(t.app).get(`/api/lab/library-versions/${'9'.repeat(5000)}/cross-product`).set(await t.authFor('analyst')), /id/);
  });
});
