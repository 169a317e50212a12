import { request as httpRequest, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { useTestApp } from '../../testing';
import { useOwnUploadFolder } from '../../testing/upload-folders';
import { MEASUREMENT_LIMITS } from './upload-measurements';

// Seeding the demo libraries in beforeAll takes seconds on a busy two-core machine.
jest.setTimeout(90_000);

// Every upload of this file goes to a temporary folder of its own, so what is left behind can be counted.
const uploads = useOwnUploadFolder();

const t = useTestApp();
let bench: { instrumentId: string; cellId: string };
let server: Server;
let port: number;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const res = await request(t.app).get('/api/lab/bench').set(await t.authFor('analyst'));
  bench = { instrumentId: res.body.instruments[0].id, cellId: res.body.cells[0].id };
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as AddressInfo).port;
});
afterAll(async () => {
  await new Promise((r) => server.close(r));
});

const SAMPLE = 'OP-7K3M-Q9';
const good = () => demoFiles().filter((f) => f.sampleCode === SAMPLE)[0];

function upload(files: { fileName: string; text: string | Buffer }[], auth: Record<string, string>) {
  let req = request(t.app)
    .post(`/api/lab/samples/${SAMPLE}/measurements`)
    .set(auth)
    .field('instrumentId', bench.instrumentId)
    .field('cellId', bench.cellId)
    .field('cellConstantSource', 'latest-calibration')
    .field('temperatureC', '22');
  for (const f of files) req = req.attach('files', Buffer.from(f.text), f.fileName);
  return req;
}

const replicateCount = async (): Promise<number> => Number((await t.db.query(`SELECT count(*) AS n FROM replicate r JOIN sample s ON s.id = r.sample_id WHERE s.code = $1`, [SAMPLE]))[0].n);
describe('measurement uploads streamed to temporary files', () => {
  it('saves the files and leaves no temporary file behind', async () => {
    const before = await replicateCount();
    const res = await upload([good(), { ...good(), fileName: 'second.csv' }], await t.authFor('analyst'));
    expect(res.status).toBe(201);
    expect(res.body.saved).toHaveLength(2);
    // The raw file is stored byte for byte as uploaded.
    const [{ id: sampleId }] = await t.db.query(`SELECT id FROM sample WHERE code = $1`, [SAMPLE]);
    const raw = await request(t.app).get(`/api/lab/samples/${sampleId}/replicates/${res.body.saved[0].id}/file`).set(await t.authFor('analyst')).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect((raw.body as Buffer).toString('utf8')).toBe(good().text);
    expect(await replicateCount()).toBe(before + 2);
    await uploads.until(() => uploads.folders().length === 0, 'the upload folder is removed');
  });

  it('refuses a file over the size limit with 413 naming it, saves nothing and leaves no temporary file', async () => {
    const before = await replicateCount();
    const huge = Buffer.alloc(MEASUREMENT_LIMITS.fileSizeBytes + 1024, 'x');
    const res = await upload([good(), { fileName: 'huge.csv', text: huge }], await t.authFor('analyst'));
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('urn:ohmprint:problem:file-too-large');
    expect(res.body.detail).toContain(`larger than ${MEASUREMENT_LIMITS.fileSizeBytes / 1048576} MB`);
    expect(await replicateCount()).toBe(before);
    await uploads.until(() => uploads.folders().length === 0, 'the upload folder is removed');
  });

  it('names the line and column of a NUL byte inside a file, and still saves the good file', async () => {
    const lines = good().text.split('\n');
    const dataLine = lines.findIndex((l, i) => i > 0 && /^\s*[0-9]/.test(l));
    lines[dataLine] = lines[dataLine].replace(/[;,]/, '$&\u0000');
    const res = await upload([good(), { fileName: 'nul.csv', text: lines.join('\n') }], await t.authFor('analyst'));
    expect(res.status).toBe(201);
    expect(res.body.saved).toHaveLength(1);
    expect(res.body.rejected).toEqual([expect.objectContaining({ fileName: 'nul.csv', line: dataLine + 1, problem: 'unreadable', message: expect.stringMatching(/^nul\.csv: .*line \d+/) })]);
    await uploads.until(() => uploads.folders().length === 0, 'the upload folder is removed');
  });

  it('an upload cut off mid-stream leaves no temporary file and no partial data; what was saved before stays', async () => {
    const before = await replicateCount();
    expect(before).toBeGreaterThan(0);
    const boundary = 'ohmprint-cut-off';
    const auth = await t.authFor('analyst');
    const req = httpRequest({
      host: '127.0.0.1',
      port,
      method: 'POST',
      path: `/api/lab/samples/${SAMPLE}/measurements`,
      headers: { ...auth, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(4 * 1048576) },
    });
    req.on('error', () => undefined);
    const field = (name: string, value: string) => `--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
    req.write(field('instrumentId', bench.instrumentId) + field('cellId', bench.cellId) + field('cellConstantSource', 'latest-calibration') + field('temperatureC', '22'));
    req.write(`--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="whole.csv"\r\n\r\n${good().text}\r\n`);
    req.write(`--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="cut.csv"\r\n\r\n${good().text.slice(0, 200)}`);
    await uploads.until(() => uploads.fileCount() === 2, 'both files are being written');
    req.destroy();
    await uploads.until(() => uploads.folders().length === 0, 'the upload folder is removed after the cut');
    // Nothing of the cut-off upload was stored, not even its complete first file, and nothing earlier was lost.
    await new Promise((r) => setTimeout(r, 300));
    expect(await replicateCount()).toBe(before);
  });

  it('two uploads of one lab at once both save, and leave nothing behind', async () => {
    const before = await replicateCount();
    const auth = await t.authFor('analyst');
    const [a, b] = await Promise.all([upload([good()], auth), upload([{ ...good(), fileName: 'b.csv' }, { ...good(), fileName: 'c.csv' }], auth)]);
    expect([a.status, b.status]).toEqual([201, 201]);
    const numbers = [...a.body.saved, ...b.body.saved].map((r: { replicateNumber: number }) => r.replicateNumber).sort((x: number, y: number) => x - y);
    expect(new Set(numbers).size).toBe(3);
    expect(await replicateCount()).toBe(before + 3);
    await uploads.until(() => uploads.folders().length === 0, 'the upload folders are removed');
  });

  it('holds no database transaction open while its files wait for, and run in, the worker pool', async () => {
    // Keep the pool busy so the upload's files wait their turn; meanwhile look for open transactions.
    const busy = Array.from({ length: 10 }, () => runCpuTask('hashPassword', { password: 'keep the pool busy', cost: 12 }));
    const uploading = upload([good(), { ...good(), fileName: 'queued.csv' }], await t.authFor('analyst'));
    const done = uploading.then((r) => r);
    const idleInTransaction: number[] = [];
    const poolBusy = Promise.all(busy);
    let poolDone = false;
    void poolBusy.finally(() => (poolDone = true));
    while (!poolDone) {
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND state = 'idle in transaction' AND now() - xact_start > interval '1 second' AND pid <> pg_backend_pid()`);
      idleInTransaction.push(n);
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(idleInTransaction.length).toBeGreaterThan(5);
    expect(Math.max(...idleInTransaction)).toBe(0);
    expect((await done).status).toBe(201);
  });
});
