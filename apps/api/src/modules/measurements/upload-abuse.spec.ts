import request from 'supertest';
import { parseSpectrumFile } from '@ohmprint/spectral-engine';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { useTestApp } from '../../testing';
import { MEASUREMENT_LIMITS } from './upload-measurements';

// Seeding the demo libraries in beforeAll takes seconds on a busy two-core machine.
jest.setTimeout(60_000);

const t = useTestApp();
let bench: { instrumentId: string; cellId: string };

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const res = await request(t.app).get('/api/lab/bench').set(await t.authFor('analyst'));
  bench = { instrumentId: res.body.instruments[0].id, cellId: res.body.cells[0].id };
});

const SAMPLE = 'OP-7K3M-Q9';
const HEADER = "Frequency (Hz);Z' (Ω);Z'' (Ω)";
const good = () => demoFiles().filter((f) => f.sampleCode === SAMPLE)[0];
const exportOf = (rows: string[]) => [HEADER, ...rows].join('\n');

function upload(auth: Record<string, string>, files: { fileName: string; text: string }[], extraFields: Record<string, string> = {}) {
  let req = request(t.app)
    .post(`/api/lab/samples/${SAMPLE}/measurements`)
    .set(auth)
    .field('instrumentId', bench.instrumentId)
    .field('cellId', bench.cellId)
    .field('cellConstantSource', 'latest-calibration')
    .field('temperatureC', '22');
  for (const [name, value] of Object.entries(extraFields)) req = req.field(name, value);
  for (const f of files) req = req.attach('files', Buffer.from(f.text), f.fileName);
  return req;
}

const replicateCount = async (): Promise<number> => Number((await t.db.query(`SELECT count(*) AS n FROM replicate r JOIN sample s ON s.id = r.sample_id WHERE s.code = $1`, [SAMPLE]))[0].n);

describe('measurement upload under abuse', () => {
  it('refuses only the files with zero, 1e-300 Ω, 1e200 Ω or 1e308 Hz values, naming line and column, and keeps the good file', async () => {
    const before = await replicateCount();
    const ok = ['1000;120;-30', '100;150;-60', '10;200;-90', '1;260;-40', '0.1;300;-10'];
    const res = await upload(await t.authFor('analyst'), [
      good(),
      { fileName: 'zeros.csv', text: exportOf(ok.map((r) => `${r.split(';')[0]};0;0`)) },
      { fileName: 'tiny.csv', text: exportOf([...ok.slice(0, 2), '10;1e-300;-90', ...ok.slice(3)]) },
      { fileName: 'huge.csv', text: exportOf([...ok.slice(0, 4), '0.1;300;1e200']) },
      { fileName: 'far.csv', text: exportOf(['1e308;120;-30', ...ok.slice(1)]) },
    ]);
    expect(res.status).toBe(201);
    expect(res.body.saved.map((r: { fileName: string }) => r.fileName)).toEqual([good().fileName]);
    expect(res.body.rejected.map((r: { fileName: string; line: number; column: number }) => [r.fileName, r.line, r.column])).toEqual([
      ['zeros.csv', 2, 6],
      ['tiny.csv', 4, 4],
      ['huge.csv', 6, 9],
      ['far.csv', 2, 1],
    ]);
    expect(await replicateCount()).toBe(before + 1);
  });

  it('stores every point exactly as parsed (the worker writes the column text), awkward doubles included', async () => {
    const rows = ['1000.0000000000001;120.1;-30.3', '100;0.30000000000000004;-60', '10;200.00000000000003;-90.00000000000001', '1;260;-40', '0.1;300;-10'];
    const res = await upload(await t.authFor('analyst'), [{ fileName: 'awkward.csv', text: exportOf(rows) }]);
    expect(res.status).toBe(201);
    const [stored] = await t.db.query(`SELECT frequency_hz, re, im FROM replicate WHERE id = $1`, [res.body.saved[0].id]);
    // The same doubles as the engine's parser gives on this thread, bit for bit.
    const parsed = parseSpectrumFile(exportOf(rows), { maxPoints: MEASUREMENT_LIMITS.pointsPerFile });
    expect(stored.frequency_hz).toEqual(Array.from(parsed.frequencyHz));
    expect(stored.re).toEqual(Array.from(parsed.re));
    expect(stored.im).toEqual(Array.from(parsed.im));
    expect(stored.re).toContain(0.30000000000000004);
  });

  it('refuses a file with more rows than the limit, naming the limit', async () => {
    const rows = Array.from({ length: MEASUREMENT_LIMITS.pointsPerFile + 1 }, (_, i) => `${(1 + i * 0.01).toFixed(2)};${100 + i};-10`);
    const res = await upload(await t.authFor('analyst'), [{ fileName: 'endless.csv', text: exportOf(rows) }]);
    expect(res.status).toBe(400);
    expect(res.body.detail).toContain(`more than ${MEASUREMENT_LIMITS.pointsPerFile} data rows`);
  });

  it('refuses more files than the limit with 413 naming it', async () => {
    const files = Array.from({ length: MEASUREMENT_LIMITS.files + 1 }, (_, i) => ({ ...good(), fileName: `rep-${i}.csv` }));
    const res = await upload(await t.authFor('analyst'), files);
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('urn:ohmprint:problem:too-many-files');
    expect(res.body.detail).toContain(`At most ${MEASUREMENT_LIMITS.files} files`);
  });

  it('refuses thousands of form fields and megabyte-long fields with 413 naming the limit', async () => {
    const many = Object.fromEntries(Array.from({ length: 40 }, (_, i) => [`extra${i}`, 'x']));
    const tooMany = await upload(await t.authFor('analyst'), [good()], many);
    expect(tooMany.status).toBe(413);
    expect(tooMany.body.type).toBe('urn:ohmprint:problem:too-many-fields');
    expect(tooMany.body.detail).toMatch(/At most \d+ text fields/);

    const tooLong = await upload(await t.authFor('analyst'), [good()], { remarks: 'x'.repeat(1024 * 1024) });
    expect(tooLong.status).toBe(413);
    expect(tooLong.body.type).toBe('urn:ohmprint:problem:field-too-long');
    expect(tooLong.body.detail).toMatch(/text field \(field "remarks"\) is longer than 16 KB/);
  });

  it('refuses a NUL character in a form field with 400 naming the field', async () => {
    const res = await upload(await t.authFor('analyst'), [good()], { note: 'bench\u0000two' });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'note', message: expect.stringMatching(/NUL/) }]);
  });

  it('refuses uploads with the key of a suspended lab, storing nothing', async () => {
    const issued = await request(t.app).post('/api/lab/instrument-keys').set(await t.authFor('lab-admin')).send({ name: 'Bench PC' });
    const key = { Authorization: `Bearer ${issued.body.secret}` };
    expect((await upload(key, [good()])).status).toBe(201);
    const [lab] = await t.db.query(`SELECT lab_id FROM sample WHERE code = $1`, [SAMPLE]);
    const suspended = await request(t.app).patch(`/api/operator/labs/${lab.lab_id}`).set(await t.authFor('platform-operator')).send({ status: 'suspended', reason: 'Suspension drill (test)' });
    expect(suspended.status).toBe(200);
    const before = await replicateCount();
    const refused = await upload(key, [good()]);
    expect(refused.status).toBe(403);
    expect(refused.body.type).toBe('urn:ohmprint:problem:lab-suspended');
    expect(await replicateCount()).toBe(before);
  });
});

