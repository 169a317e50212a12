import { createHash } from 'node:crypto';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { brokenDemoFile, demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { parseSpectrumFile } from '@ohmprint/spectral-engine';
import { useTestApp } from '../../testing';

// Seeding the demo libraries in beforeAll takes seconds on a busy two-core machine.
jest.setTimeout(30_000);

const t = useTestApp();
let bench: { instrumentId: string; cellId: string };

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const res = await request(t.app).get('/api/lab/bench').set(await t.authFor('analyst'));
  bench = { instrumentId: res.body.instruments[0].id, cellId: res.body.cells[0].id };
});

const filesOf = (code: string) => demoFiles().filter((f) => f.sampleCode === code);

function upload(path: string, auth: Record<string, string>, files: { fileName: string; text: string }[], temperatureC = '22.5') {
  let req = request(t.app).post(path).set(auth).field('instrumentId', bench.instrumentId).field('cellId', bench.cellId).field('cellConstantSource', 'latest-calibration').field('temperatureC', temperatureC);
  for (const f of files) req = req.attach('files', Buffer.from(f.text), f.fileName);
  return req;
}

describe('measurement upload', () => {
  it('saves the good files of an upload and names the bad one with the engine’s line and column', async () => {
    const [rep1, rep2] = filesOf('OP-7K3M-Q9');
    const broken = brokenDemoFile();
    const res = await upload('/api/lab/samples/OP-7K3M-Q9/measurements', await t.authFor('analyst'), [rep1, broken, rep2]);
    expect(res.status).toBe(201);
    expect(res.body.saved.map((r: { fileName: string; replicateNumber: number }) => [r.fileName, r.replicateNumber])).toEqual([
      [rep1.fileName, 1],
      [rep2.fileName, 2],
    ]);
    expect(res.body.rejected).toEqual([{ fileName: broken.fileName, line: 9, column: expect.any(Number), message: expect.stringMatching(new RegExp(`^${broken.fileName}: line 9, column \\d+: .*12\\.3\\.4`)) }]);
    const saved = res.body.saved[0];
    // Cell constant from the seeded KCl record: K = 1413 µS/cm × 722.0 Ω = 1.020186 cm⁻¹.
    expect(saved).toMatchObject({ cellConstantSource: 'latest-calibration', pointCount: 51, minFrequencyHz: 10, maxFrequencyHz: 1e6, via: 'portal' });
    expect(saved.cellConstantPerCm).toBeCloseTo(1.020186, 6);
    expect(saved.kramersKronig).toMatchObject({ passed: true, limitPercent: 2 });
    const [sample] = await t.db.query(`SELECT state FROM sample WHERE code = 'OP-7K3M-Q9'`);
    expect(sample.state).toBe('measuring');
  });

  it('saves nothing and answers 400 when no file can be read', async () => {
    const broken = brokenDemoFile();
    const res = await upload('/api/lab/samples/OP-9RWD-6F/measurements', await t.authFor('analyst'), [broken]);
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: `files[${broken.fileName}]`, message: expect.stringContaining('line 9') }]);
    expect((await t.db.query(`SELECT count(*)::int AS n FROM replicate r JOIN sample s ON s.id = r.sample_id WHERE s.code = 'OP-9RWD-6F'`))[0].n).toBe(0);
  });

  it('asks for the cell constant when "entered" is chosen without one', async () => {
    const res = await request(t.app)
      .post('/api/lab/samples/OP-9RWD-6F/measurements')
      .set(await t.authFor('analyst'))
      .field('instrumentId', bench.instrumentId)
      .field('cellId', bench.cellId)
      .field('cellConstantSource', 'entered')
      .field('temperatureC', '21')
      .attach('files', Buffer.from(filesOf('OP-9RWD-6F')[0].text), 'a.txt');
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ field: 'cellConstantPerCm' })]);
  });

  it('reports replicate agreement, and excluding a replicate needs a reason and is audited', async () => {
    const analyst = await t.authFor('analyst');
    const id = (await t.db.query(`SELECT id FROM sample WHERE code = 'OP-7K3M-Q9'`))[0].id;
    const before = await request(t.app).get(`/api/lab/samples/${id}/measurements`).set(analyst);
    expect(before.body.agreement).toMatchObject({ replicateCount: 2, passed: true, limit: 0.01 });
    const replicate = before.body.replicates[1].id;
    const noReason = await request(t.app).post(`/api/lab/samples/${id}/replicates/${replicate}/exclude`).set(analyst).send({});
    expect(noReason.status).toBe(400);
    const res = await request(t.app).post(`/api/lab/samples/${id}/replicates/${replicate}/exclude`).set(analyst).send({ reason: 'Bubble on the electrode' });
    expect(res.status).toBe(200);
    expect(res.body.replicates[1]).toMatchObject({ excluded: true, exclusionReason: 'Bubble on the electrode' });
    expect(res.body.agreement).toBeNull();
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'measurement.replicate-excluded' AND subject_id = $1`, [replicate]);
    expect(audit.details).toMatchObject({ reason: 'Bubble on the electrode', replicateNumber: 2 });
  });

  it('serves a replicate’s spectrum as measured for the plots', async () => {
    const id = (await t.db.query(`SELECT id FROM sample WHERE code = 'OP-7K3M-Q9'`))[0].id;
    const analyst = await t.authFor('analyst');
    const list = await request(t.app).get(`/api/lab/samples/${id}/measurements`).set(analyst);
    const res = await request(t.app).get(`/api/lab/samples/${id}/replicates/${list.body.replicates[0].id}/spectrum`).set(analyst);
    expect(res.body.frequencyHz).toHaveLength(51);
    expect(res.body.frequencyHz[0]).toBe(10);
    expect(res.body.im.every((v: number) => v < 0)).toBe(true);
  });
});

/**
 * A sweep whose sample warmed while it ran: Z′ drifts up by 30 % towards the low frequencies
 * while Z″ does not, which no causal, stable system produces — so Kramers–Kronig must fail it.
 */
function driftingExport(text: string): string {
  const s = parseSpectrumFile(text);
  const n = s.re.length;
  const rows = Array.from(s.frequencyHz, (f, i) => `${f},${s.re[i] * (1 + (0.3 * (n - 1 - i)) / (n - 1))},${s.im[i]}`);
  return ["Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...rows].join('\n');
}

describe('quality of the measurements', () => {
  it('marks a drifting sweep as failing Kramers–Kronig and flags it, and the disagreement, in the analysis', async () => {
    const analyst = await t.authFor('analyst');
    const [good, other] = filesOf('OP-8MJA-4T');
    const res = await upload('/api/lab/samples/OP-8MJA-4T/measurements', analyst, [good, { fileName: 'drifting.csv', text: driftingExport(other.text) }], '19');
    expect(res.status).toBe(201);
    expect(res.body.saved.map((r: { kramersKronig: { passed: boolean } }) => r.kramersKronig.passed)).toEqual([true, false]);
    expect(res.body.saved[1].kramersKronig.maxResidualPercent).toBeGreaterThan(2);
    const [row] = await t.db.query(
      `SELECT s.id AS sample_id, v.id AS version_id FROM sample s JOIN test_order o ON o.id = s.order_id
       JOIN reference_library l ON l.product_id = o.product_id JOIN library_version v ON v.library_id = l.id WHERE s.code = 'OP-8MJA-4T'`,
    );
    const analysis = await request(t.app).post(`/api/lab/samples/${row.sample_id}/analyses`).set(analyst).send({ libraryVersionId: row.version_id });
    expect(analysis.status).toBe(201);
    const codes = analysis.body.result.qualityFlags.map((f: { code: string }) => f.code);
    expect(codes).toEqual(expect.arrayContaining(['kk-failed', 'poor-replicate-agreement']));
    expect(analysis.body.result.qualityFlags.find((f: { code: string }) => f.code === 'kk-failed').message).toContain('drifting.csv');
  });
});

describe('instrument keys', () => {
  it('lets a bench computer post measurements with a key, only on the upload route, until revoked', async () => {
    const admin = await t.authFor('lab-admin');
    const issued = await request(t.app).post('/api/lab/instrument-keys').set(admin).send({ name: 'Bench PC 1' });
    expect(issued.status).toBe(201);
    const secret: string = issued.body.secret;
    expect(secret).toMatch(/^ohmbench-[a-z2-7]{40}$/);
    expect(secret.startsWith(issued.body.key.prefix)).toBe(true);
    const [stored] = await t.db.query('SELECT secret_sha256 FROM instrument_key WHERE id = $1', [issued.body.key.id]);
    expect(stored.secret_sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(stored.secret_sha256).not.toContain(secret.slice(9));

    const key = { Authorization: `Bearer ${secret}` };
    const posted = await upload('/api/lab/samples/OP-9RWD-6F/measurements', key, filesOf('OP-9RWD-6F'), '21');
    expect(posted.status).toBe(201);
    expect(posted.body.saved).toHaveLength(3);
    expect(posted.body.saved[0]).toMatchObject({ via: 'instrument-key', uploadedBy: null });

    expect((await request(t.app).get('/api/lab/samples').set(key)).status).toBe(401);
    const listed = await request(t.app).get('/api/lab/instrument-keys').set(admin);
    expect(listed.body[0].lastUsedAt).not.toBeNull();
    expect(JSON.stringify(listed.body)).not.toContain(secret);

    expect((await request(t.app).post(`/api/lab/instrument-keys/${issued.body.key.id}/revoke`).set(admin)).status).toBe(200);
    const refused = await upload('/api/lab/samples/OP-9RWD-6F/measurements', key, filesOf('OP-9RWD-6F').slice(0, 1), '21');
    expect(refused.status).toBe(401);
  });

  it('still accepts a key issued with the earlier prefix until it is revoked', async () => {
    const admin = await t.authFor('lab-admin');
    const issued = await request(t.app).post('/api/lab/instrument-keys').set(admin).send({ name: 'Bench PC from before' });
    const earlier = `ohm_live_${'b'.repeat(40)}`;
    await t.db.query('UPDATE instrument_key SET secret_sha256 = $2, prefix = $3 WHERE id = $1',
      [issued.body.key.id, createHash('sha256').update(earlier).digest('hex'), earlier.slice(0, 15)]);
    const posted = await upload('/api/lab/samples/OP-9RWD-6F/measurements', { Authorization: `Bearer ${earlier}` }, filesOf('OP-9RWD-6F').slice(0, 1), '21');
    expect(posted.status).toBe(201);
    expect(posted.body.saved[0]).toMatchObject({ via: 'instrument-key' });
  });

  it('keeps a lab’s key out of another lab’s samples', async () => {
    const issued = await request(t.app).post('/api/lab/instrument-keys').set(await t.authFor('lab-admin', 'marlow')).send({ name: 'Marlow bench' });
    const res = await upload('/api/lab/samples/OP-6TBS-3H/measurements', { Authorization: `Bearer ${issued.body.secret}` }, filesOf('OP-6TBS-3H'), '20.5');
    expect(res.status).toBe(404);
  });
});
