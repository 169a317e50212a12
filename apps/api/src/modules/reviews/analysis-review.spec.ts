import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { analyseDemoSample, issuedReport, measureDemoSample, useTestApp } from '../../testing';

// Issuing the first report creates the lab's signing credential, which takes seconds.
jest.setTimeout(30_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

const measured = (code: string) => measureDemoSample(t, code);
const analysed = (code: string) => analyseDemoSample(t, code);

describe('analysis', () => {
  it('gives the verdict the demo files were made for, with map, histogram, fit and method snapshot', async () => {
    const watered = await analysed('OP-9RWD-6F');
    const res = await request(t.app).get(`/api/lab/analyses/${watered}`).set(await t.authFor('reviewer'));
    const r = res.body.result;
    expect(r.verdict).toBe('not-consistent');
    expect(r.nearest.distance).toBeGreaterThan(r.t99);
    // Ridgeline Red's newest demo version holds 80 lots; the result keeps and maps the sample's 59 nearest.
    expect(r.lotCount).toBe(80);
    expect(r.distances).toHaveLength(59);
    expect(r.map.lots).toHaveLength(59);
    expect(r.histogram.counts.reduce((a: number, b: number) => a + b, 0)).toBe(80);
    expect(r.thresholds).toMatchObject({ estimator: 'lognormal-ml', lotCount: 80, resamples: 2000 });
    expect(r.fit.parameters.map((p: { name: string }) => p.name)).toEqual(['rInf', 'r0', 'tau', 'alpha']);
    expect(r.fit.parameters.map((p: { description: string }) => p.description)).toEqual([
      'High-frequency resistance R∞',
      'Low-frequency resistance R0',
      'Relaxation time τ',
      'Dispersion exponent α (1 = single relaxation)',
    ]);
    expect(res.body.method).toMatchObject({ model: 'cole-cole', gridPoints: 41, referenceTemperatureC: 20 });
    expect(res.body.engineVersion).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('reproduces a stored analysis number for number, even after a replicate is excluded', async () => {
    const id = await analysed('OP-7K3M-Q9');
    const analyst = await t.authFor('analyst');
    const stored = await request(t.app).get(`/api/lab/analyses/${id}`).set(analyst);
    expect(stored.body.result.verdict).toBe('consistent');
    const replicates = await request(t.app).get(`/api/lab/samples/${stored.body.sample.id}/measurements`).set(analyst);
    await request(t.app).post(`/api/lab/samples/${stored.body.sample.id}/replicates/${replicates.body.replicates[0].id}/exclude`).set(analyst).send({ reason: 'Checking reproduction' });
    const check = await request(t.app).get(`/api/lab/analyses/${id}/reproduce`).set(analyst);
    expect(check.status).toBe(200);
    expect(check.body).toMatchObject({ reproduced: true, differences: [], maxAbsoluteDifference: 0 });
  });

  it('refuses a library version of another product', async () => {
    const { sampleId } = await measured('OP-6TBS-3H');
    const [other] = await t.db.query(`SELECT v.id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id WHERE p.name = 'Ridgeline Red (demo)'`);
    const res = await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(await t.authFor('analyst')).send({ libraryVersionId: other.id });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'libraryVersionId', message: 'belongs to another product' }]);
  });
});

describe('review', () => {
  it('refuses approval by the analyst who ran it, even holding the reviewer role (four-eyes)', async () => {
    const analystId = await t.userIdFor('analyst');
    const [lab] = await t.db.query('SELECT lab_id FROM app_user WHERE id = $1', [analystId]);
    await t.db.query(`INSERT INTO lab_role_membership (lab_id, user_id, role) VALUES ($1, $2, 'reviewer')`, [lab.lab_id, analystId]);
    const id = await analysed('OP-4HXT-2B');
    const analyst = await t.authFor('analyst');
    await request(t.app).put(`/api/lab/analyses/${id}/remarks`).set(analyst).send({ remarks: 'Nearest distance above T99.' });
    expect((await request(t.app).post(`/api/lab/analyses/${id}/submit`).set(analyst)).status).toBe(200);

    const own = await request(t.app).post(`/api/lab/analyses/${id}/approve`).set(analyst).send({});
    expect(own.status).toBe(403);
    expect(own.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(own.body).toMatchObject({ type: 'urn:ohmprint:problem:four-eyes', title: 'Four-eyes rule' });
    expect((await request(t.app).post(`/api/lab/analyses/${id}/return`).set(analyst).send({ comments: 'Looks fine to me' })).status).toBe(403);
    const [a] = await t.db.query('SELECT status FROM analysis WHERE id = $1', [id]);
    expect(a.status).toBe('submitted');
  });

  it('approves with another reviewer at once (202), and a worker issues the signed report', async () => {
    const [submitted] = await t.db.query(`SELECT a.id, a.sample_id FROM analysis a WHERE a.status = 'submitted'`);
    const res = await request(t.app).post(`/api/lab/analyses/${submitted.id}/approve`).set(await t.authFor('reviewer')).send({ comments: 'Agreed.' });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ analysisId: submitted.id, state: 'issuing', report: null, detail: null });
    const issued = await issuedReport(t, submitted.id);
    expect(issued.number).toMatch(/^CAL-\d{4}-\d{6}$/);
    const [report] = await t.db.query('SELECT verdict, sample_code, status FROM test_report WHERE id = $1', [issued.id]);
    // The demo's 11 % blend reads not consistent against Ridgeline Red's 80-lot library (see demo-verdicts.spec.ts).
    expect(report).toEqual({ verdict: 'not-consistent', sample_code: 'OP-4HXT-2B', status: 'issued' });
    const [sample] = await t.db.query('SELECT state FROM sample WHERE id = $1', [submitted.sample_id]);
    expect(sample.state).toBe('reported');
    const view = await request(t.app).get(`/api/lab/analyses/${submitted.id}`).set(await t.authFor('analyst'));
    expect(view.body).toMatchObject({ status: 'approved', reviews: [{ decision: 'approved', comments: 'Agreed.', reviewer: { displayName: 'Rae Viewer (demo)' } }] });
  });

  it('returns with comments: the sample goes back to the analyst, who is e-mailed', async () => {
    const id = await analysed('OP-8MJA-4T');
    await request(t.app).post(`/api/lab/analyses/${id}/submit`).set(await t.authFor('analyst'));
    const res = await request(t.app).post(`/api/lab/analyses/${id}/return`).set(await t.authFor('reviewer')).send({ comments: 'Please re-measure at 20 °C.' });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('returned');
    const [sample] = await t.db.query(`SELECT state FROM sample WHERE code = 'OP-8MJA-4T'`);
    expect(sample.state).toBe('returned-for-rework');
    const mail = await t.db.query(`SELECT to_address FROM email_outbox WHERE subject LIKE '%OP-8MJA-4T returned%'`);
    expect(mail).toEqual([{ to_address: 'analyst@calder.test' }]);
  });
});

describe('client orders', () => {
  it('shows a client its own orders with sample states, and another organisation’s order as missing', async () => {
    const client = await t.authFor('client-member');
    const res = await request(t.app).get('/api/client/orders?sort=placedAt&dir=asc').set(client);
    expect(res.status).toBe(200);
    expect(res.body.items.every((o: { clientOrganisation: { name: string } }) => o.clientOrganisation.name === 'Hollin Ridge Cellars')).toBe(true);
    expect(res.body.items.flatMap((o: { samples: { code: string }[] }) => o.samples.map((s) => s.code))).toEqual(expect.arrayContaining(['OP-7K3M-Q9', 'OP-3VNC-8P']));
    const [milkOrder] = await t.db.query(`SELECT order_id FROM sample WHERE code = 'OP-8MJA-4T'`);
    expect((await request(t.app).get(`/api/client/orders/${milkOrder.order_id}`).set(client)).status).toBe(404);
    const products = await request(t.app).get('/api/client/products').set(client);
    expect(products.body.items.map((p: { name: string }) => p.name)).toEqual(['Hollin Dry White (demo)', 'Ridgeline Red (demo)']);
    expect(products.body.items[1].publishedLibraryVersion).toMatchObject({ version: 2, lotCount: 80 });
  });
});

describe('published library versions are frozen', () => {
  it('keep their method when the lab changes its settings, and the database refuses edits', async () => {
    const admin = await t.authFor('lab-admin');
    const current = await request(t.app).get('/api/lab/method-settings').set(admin);
    const changed = await request(t.app).put('/api/lab/method-settings').set(admin).send({ ...current.body, bandMaxHz: 200_000, kkResidualLimitPercent: 1 });
    expect(changed.status).toBe(200);
    expect((await request(t.app).get('/api/lab/method-settings').set(admin)).body.bandMaxHz).toBe(200_000);
    const [version] = await t.db.query(`SELECT v.id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id WHERE p.name = 'Ridgeline Red (demo)' ORDER BY v.version DESC LIMIT 1`);
    const detail = await request(t.app).get(`/api/lab/library-versions/${version.id}`).set(admin);
    expect(detail.body).toMatchObject({ status: 'published', version: 2, lotCount: 80, method: { bandMaxHz: 500_000 } });
    expect(detail.body.calibration.t95).toBeLessThanOrEqual(detail.body.calibration.t99);
    await expect(t.db.query(`UPDATE library_version SET grid_hz = ARRAY[1, 2]::float8[] WHERE id = $1`, [version.id])).rejects.toThrow(/frozen/);
    await expect(t.db.query(`DELETE FROM reference_lot WHERE library_version_id = $1`, [version.id])).rejects.toThrow(/frozen/);
  });

  it('refuses method settings whose band is upside down, naming the field', async () => {
    const admin = await t.authFor('lab-admin');
    const current = await request(t.app).get('/api/lab/method-settings').set(admin);
    const res = await request(t.app).put('/api/lab/method-settings').set(admin).send({ ...current.body, bandMinHz: 1000, bandMaxHz: 10 });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ field: 'bandMaxHz' })]);
  });
});
