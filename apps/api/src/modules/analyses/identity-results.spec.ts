import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { analyseDemoSample, approveAndIssue, useTestApp } from '../../testing';

// Seeding, and issuing the first report (which creates the lab's signing credential), take seconds.
jest.setTimeout(90_000);

const t = useTestApp();
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-identity-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

async function pdfText(reportId: string): Promise<string> {
  const [report] = await t.db.query('SELECT number, pdf FROM test_report WHERE id = $1', [reportId]);
  const file = join(dir, `${report.number}.pdf`);
  writeFileSync(file, report.pdf);
  return execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

async function submitAndApprove(analysisId: string): Promise<{ id: string; number: string }> {
  const analyst = await t.authFor('analyst');
  expect((await request(t.app).post(`/api/lab/analyses/${analysisId}/submit`).set(analyst)).status).toBe(200);
  return approveAndIssue(t, analysisId);
}

describe('a sample that does not belong to its library', () => {
  it('is flagged as resembling the milk when the demo milk files were uploaded to the apple juice sample', async () => {
    const analyst = await t.authFor('analyst');
    const bench = (await request(t.app).get('/api/lab/bench').set(analyst)).body;
    const milk = demoFiles().filter((f) => f.sampleCode === 'OP-8MJA-4T');
    let req = request(t.app).post('/api/lab/samples/OP-6TBS-3H/measurements').set(analyst).field('instrumentId', bench.instruments[0].id).field('cellId', bench.cells[0].id);
    req = req.field('confirmations', JSON.stringify(milk.map((f) => ({ fileName: f.fileName, about: 'sample-code', reason: 'Testing the wrong-sample flag' }))));
    for (const f of milk) req = req.attach('files', Buffer.from(f.text), f.fileName);
    const uploaded = await req;
    expect(uploaded.status).toBe(201);

    const [apple] = await t.db.query(
      `SELECT s.id, v.id AS version_id FROM sample s JOIN test_order o ON o.id = s.order_id JOIN reference_library l ON l.product_id = o.product_id
       JOIN library_version v ON v.library_id = l.id AND v.status = 'published' WHERE s.code = 'OP-6TBS-3H'`,
    );
    const run = await request(t.app).post(`/api/lab/samples/${apple.id}/analyses`).set(analyst).send({ libraryVersionId: apple.version_id });
    expect(run.status).toBe(201);
    const a = (await request(t.app).get(`/api/lab/analyses/${run.body.id}`).set(await t.authFor('reviewer'))).body;
    expect(a.result.verdict).toBe('not-consistent');
    expect(a.result.nearest.distance).toBeGreaterThan(3 * a.result.t99);
    const flag = a.result.qualityFlags.find((f: { code: string }) => f.code === 'resembles-other-product');
    expect(flag.message).toMatch(/^Resembles Brightwater Whole Milk \(demo\) more than the ordered product \(Sunvale Cloudy Apple \(demo\)\)/);
    // Another client's product is not named on this client's report.
    expect(flag.reportMessage).toMatch(/^Resembles another product in the laboratory's libraries \(milk\)/);

    const report = await submitAndApprove(run.body.id);
    const text = await pdfText(report.id);
    expect(text).toContain("Resembles another product in the laboratory's libraries (milk) more than the ordered product");
    expect(text).not.toContain('Brightwater');
  });

  it('is not raised for an authentic sample, nor for an adulterated one of the right product', async () => {
    for (const code of ['OP-7K3M-Q9', 'OP-9RWD-6F']) {
      const id = await analyseDemoSample(t, code);
      const a = (await request(t.app).get(`/api/lab/analyses/${id}`).set(await t.authFor('analyst'))).body;
      expect(a.result.qualityFlags.map((f: { code: string }) => f.code)).not.toContain('resembles-other-product');
    }
  });
});

describe('temperature on the analysis and the report', () => {
  it('states the measurement temperature from the files and the referral applied', async () => {
    const id = await analyseDemoSample(t, 'OP-4HXT-2B');
    const a = (await request(t.app).get(`/api/lab/analyses/${id}`).set(await t.authFor('analyst'))).body;
    expect(a.measurementTemperatures).toEqual([1, 2, 3].map((n) => ({ replicateNumber: n, fileName: `OP-4HXT-2B_ridgeline-red_rep${n}.csv`, temperatureC: 18, source: 'file' })));
    expect(a.method).toMatchObject({ referenceTemperatureC: 20, temperatureCoefficientPerC: 0.02 });
    const report = await submitAndApprove(id);
    const text = await pdfText(report.id);
    expect(text).toContain('Measurement temperature 18.0 °C for all 3 replicates (stated in the export)');
    expect(text).toContain('referred to 20.0 °C with a linear coefficient α of 2 %/°C: Z · (1 + α (T − T₀)) / K');
  });
});

describe('re-analysis after revocation', () => {
  it('refuses while the report is in force; after revocation the new report names the revoked one', async () => {
    const analyst = await t.authFor('analyst');
    const firstId = await analyseDemoSample(t, 'OP-7K3M-Q9');
    const [latest] = await t.db.query(`SELECT id, sample_id FROM analysis WHERE id = $1`, [firstId]);
    const original = await submitAndApprove(latest.id);
    const [{ version_id: versionId }] = await t.db.query(
      `SELECT v.id AS version_id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN product p ON p.id = l.product_id WHERE p.name = 'Ridgeline Red (demo)' AND v.status = 'published'`,
    );
    const again = () => request(t.app).post(`/api/lab/samples/${latest.sample_id}/analyses`).set(analyst).send({ libraryVersionId: versionId });

    const inForce = await again();
    expect(inForce.status).toBe(409);
    expect(inForce.body.detail).toContain('has a report in force');

    const revoked = await request(t.app).post(`/api/lab/reports/${original.id}/revoke`).set(await t.authFor('reviewer')).send({ reason: 'To be re-analysed: wrong cell constant' });
    expect(revoked.status).toBe(200);
    const detail = await request(t.app).get(`/api/lab/samples/${latest.sample_id}`).set(analyst);
    expect(detail.body).toMatchObject({ state: 'reported', revokedReport: original.number });
    const rerun = await again();
    expect(rerun.status).toBe(201);
    const [sample] = await t.db.query(`SELECT state FROM sample WHERE id = $1`, [latest.sample_id]);
    expect(sample.state).toBe('analysed');
    const view = (await request(t.app).get(`/api/lab/analyses/${rerun.body.id}`).set(analyst)).body;
    expect(view.followsRevokedReport).toBe(original.number);
    // the revoked report's own analysis does not claim to follow it
    expect((await request(t.app).get(`/api/lab/analyses/${latest.id}`).set(analyst)).body.followsRevokedReport).toBeNull();

    const next = await submitAndApprove(rerun.body.id);
    expect(next.number).not.toBe(original.number);
    const text = await pdfText(next.id);
    expect(text).toContain(`Follows revoked report ${original.number}.`);
    expect(text).toContain('wrong cell constant');

    const [{ verification_code: code }] = await t.db.query(`SELECT verification_code FROM test_report WHERE id = $1`, [next.id]);
    const verified = await request(t.app).get('/api/public/verify').query({ report: next.number, code });
    expect(verified.status).toBe(200);
    expect(verified.body).toMatchObject({ outcome: 'valid', report: { number: next.number, followsRevoked: original.number } });
    const [audit] = await t.db.query(`SELECT count(*)::int AS n FROM audit_event WHERE action = 'analysis.run' AND details->>'sampleCode' = 'OP-7K3M-Q9'`);
    expect(audit.n).toBeGreaterThanOrEqual(2);
  });

  it('keeps another lab and other roles out of re-analysis', async () => {
    const [s] = await t.db.query(`SELECT id FROM sample WHERE code = 'OP-7K3M-Q9'`);
    const [v] = await t.db.query(`SELECT id FROM library_version WHERE status = 'published' LIMIT 1`);
    expect((await request(t.app).post(`/api/lab/samples/${s.id}/analyses`).set(await t.authFor('analyst', 'marlow')).send({ libraryVersionId: v.id })).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/samples/${s.id}/analyses`).set(await t.authFor('reviewer')).send({ libraryVersionId: v.id })).status).toBe(403);
  });
});
