import request from 'supertest';
import { pearson } from '@ohmprint/spectral-engine';
import fixture from '../../../../../test/reference/fixtures/validation/validation.json';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { seedValidationDemo } from '../../../../../docker-free-scripts/seed/validation-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { analyseDemoSample, useTestApp } from '../../testing';
import { correlationTable } from './correlation';
import { kclExport } from './kcl-export.fixture';
import { csvCell, toCsv } from './csv';
import { detectionSeries, performanceVerdict } from './studies';

// Seeding the demo libraries and studies takes seconds on a busy two-core machine.
jest.setTimeout(60_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  await t.db.transaction((m) => seedValidationDemo(m));
});

async function newCell(name: string): Promise<string> {
  const res = await request(t.app).post('/api/lab/cells').set(await t.authFor('lab-admin')).send({ name, nominalConstantPerCm: 1 });
  expect(res.status).toBe(201);
  return res.body.cells.find((c: { name: string }) => c.name === name).id;
}

async function run(cellId: string, resistanceOhm: number, opts: { temperatureC?: number; daysAgo?: number; fileName?: string; text?: string } = {}) {
  const req = request(t.app)
    .post(`/api/lab/cells/${cellId}/standard-runs`)
    .set(await t.authFor('analyst'))
    .field('concentration', '0.01')
    .field('basis', 'molal')
    .field('temperatureC', String(opts.temperatureC ?? 25));
  if (opts.daysAgo !== undefined) req.field('measuredAt', new Date(Date.now() - opts.daysAgo * 86_400_000).toISOString());
  return req.attach('file', Buffer.from(opts.text ?? kclExport(resistanceOhm)), opts.fileName ?? 'kcl.csv');
}

describe('KCl standard runs', () => {
  it('gives the cell constant from the plateau and the handbook conductivity at 25 °C', async () => {
    const cellId = await newCell('Plateau cell');
    const res = await run(cellId, 710.109);
    expect(res.status).toBe(201);
    const last = res.body.runs.at(-1);
    // CRC Handbook table of standard KCl solutions (Wu, Koch & Pratt 1991): 0.01 mol/kg → 1408.23 µS/cm at 25 °C.
    expect(last.standardConductivityUsPerCm).toBeCloseTo(1408.23, 6);
    expect(last.conductivitySource).toMatch(/Wu, Koch & Pratt 1991/);
    expect(last.resistanceSource).toBe('plateau');
    // K = κ·R = 1408.23 µS/cm × 710.109 Ω = 1.0000 cm⁻¹; the plateau median sits a little above R (CPE tail).
    expect(last.cellConstantPerCm).toBeCloseTo(1.0, 3);
  });

  it('refers the conductivity to the run’s temperature by linear compensation (2 %/°C, common practice)', async () => {
    const cellId = await newCell('Warm cell');
    const res = await run(cellId, 789.0, { temperatureC: 20 });
    const last = res.body.runs.at(-1);
    // κ20 = 1408.23 × (1 + 0.02 × (20 − 25)) = 1267.407 µS/cm; within 0.5 % of the CRC's 1273.03 at 20 °C.
    expect(last.standardConductivityUsPerCm).toBeCloseTo(1267.407, 3);
    expect(Math.abs(last.standardConductivityUsPerCm - 1273.03) / 1273.03).toBeLessThan(0.005);
    expect(last.cellConstantPerCm).toBeCloseTo(1267.407e-6 * 789.0, 3);
  });

  it('falls back to R of an R + CPE fit when no point lies within 1° of 0° phase', async () => {
    const cellId = await newCell('Low band cell');
    const res = await run(cellId, 650, { text: kclExport(650, 10, 1000) });
    expect(res.status).toBe(201);
    const last = res.body.runs.at(-1);
    expect(last.resistanceSource).toBe('fit');
    expect(last.plateauResistanceOhm).toBeCloseTo(650, 2);
    expect(last.cellConstantPerCm).toBeCloseTo(1408.23e-6 * 650, 4);
  });

  it('refuses an unreadable file, an untabulated concentration and a missing file, naming the field', async () => {
    const cellId = await newCell('Refusing cell');
    const bad = await run(cellId, 700, { text: 'Freq / Hz;Zre / Ohm;-Zim / Ohm\n1000;abc;1\n' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].field).toBe('file');
    const odd = await request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(await t.authFor('analyst'))
      .field('concentration', '0.05').field('basis', 'molal').field('temperatureC', '25').attach('file', Buffer.from(kclExport(700)), 'k.csv');
    expect(odd.status).toBe(400);
    expect(odd.body.errors[0].field).toBe('certifiedConductivityAt25UsPerCm');
    const none = await request(t.app).post(`/api/lab/cells/${cellId}/standard-runs`).set(await t.authFor('analyst')).field('concentration', '0.01').field('basis', 'molal').field('temperatureC', '25');
    expect(none.status).toBe(400);
    const nul = await run(cellId, 700, { text: '\u0000\u0000\u0000' });
    expect(nul.status).toBe(400);
    expect((await t.db.query(`SELECT count(*)::int AS n FROM cell_calibration WHERE cell_id = $1`, [cellId]))[0].n).toBe(0);
  });
});

describe('control chart and the cell block', () => {
  it('a drifting run blocks uploads on the cell with a 409 naming it; a new good run releases it', async () => {
    const cellId = await newCell('Drift cell');
    const steady = [710.0, 710.6, 709.5, 710.3, 709.8, 710.1, 710.5, 709.6, 710.2, 709.9];
    for (let i = 0; i < steady.length; i++) expect((await run(cellId, steady[i], { daysAgo: 30 - i })).status).toBe(201);
    const drifted = await run(cellId, 716.0, { daysAgo: 5 });
    expect(drifted.body.status.state).toBe('out-of-control');
    expect(drifted.body.status.brokenRules.map((r: { rule: string }) => r.rule)).toEqual(['beyond-3-sigma']);
    expect(drifted.body.baselineRule).toMatch(/first 10 standard runs/);

    const analyst = await t.authFor('analyst');
    const bench = (await request(t.app).get('/api/lab/bench').set(analyst)).body;
    expect(bench.cells.find((c: { id: string }) => c.id === cellId).control.state).toBe('out-of-control');
    const files = demoFiles().filter((f) => f.sampleCode === 'OP-9RWD-6F');
    const upload = () =>
      request(t.app).post('/api/lab/samples/OP-9RWD-6F/measurements').set(analyst)
        .field('instrumentId', bench.instruments[0].id).field('cellId', cellId).field('cellConstantSource', 'latest-calibration')
        .field('temperatureC', String(files[0].temperatureC)).attach('files', Buffer.from(files[0].text), files[0].fileName);
    const refused = await upload();
    expect(refused.status).toBe(409);
    expect(refused.body.type).toBe('urn:ohmprint:problem:cell-out-of-control');
    expect(refused.body.detail).toContain('Drift cell');
    expect(refused.body.cellName).toBe('Drift cell');
    expect(refused.body.rule).toBe('beyond-3-sigma');
    expect((await t.db.query(`SELECT count(*)::int AS n FROM replicate r JOIN sample s ON s.id = r.sample_id WHERE s.code = 'OP-9RWD-6F'`))[0].n).toBe(0);
    const chart = await request(t.app).get(`/api/lab/cells/${cellId}/control-chart`).set(analyst);
    expect(chart.body.refusals).toEqual([expect.objectContaining({ sampleCode: 'OP-9RWD-6F' })]);

    const back = await run(cellId, 710.1, { daysAgo: 4 });
    expect(back.body.status.state).toBe('in-control');
    expect((await upload()).status).toBe(201);
  });

  it('trips on a trend of six rising runs', async () => {
    const cellId = await newCell('Trend cell');
    const steady = [710.0, 710.6, 709.5, 710.3, 709.8, 710.1, 710.5, 709.6, 710.2, 709.9];
    for (let i = 0; i < steady.length; i++) await run(cellId, steady[i], { daysAgo: 40 - i });
    let last;
    for (const [i, r] of [709.4, 709.6, 709.8, 710.0, 710.2, 710.4].entries()) last = await run(cellId, r, { daysAgo: 20 - i });
    expect(last?.body.status.state).toBe('out-of-control');
    expect(last?.body.status.brokenRules.map((r: { rule: string }) => r.rule)).toContain('trend');
  });
});

describe('method validation figures', () => {
  it('correlation table matches scipy.stats.pearsonr over pairwise-complete lots', () => {
    // fixtures/validation/generate.py: scipy.stats.pearsonr on the lots where both values are recorded.
    const table = correlationTable(fixture.correlationTable.parameters, fixture.correlationTable.chemistry);
    for (const e of fixture.correlationTable.expected) {
      const c = table.find((x) => x.parameter === e.parameter && x.chemistry === e.chemistry);
      expect(c?.n).toBe(e.n);
      expect(c?.r).toBeCloseTo(e.r, 12); // scipy.stats.pearsonr
      expect(Math.abs((c?.p as number) - e.p)).toBeLessThanOrEqual(1e-9 * e.p); // scipy.stats.pearsonr
    }
  });

  it('the correlation route fits every lot and correlates with the chemistry the demo recorded', async () => {
    const libs = (await request(t.app).get('/api/lab/libraries').set(await t.authFor('reviewer'))).body.items;
    const red = libs.find((l: { product: { name: string } }) => l.product.name.startsWith('Ridgeline Red'));
    const res = await request(t.app).get(`/api/lab/validation/library-versions/${red.versions[0].id}/correlation`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body.model).toBe('cole-cole');
    expect(res.body.chemistry.map((c: { field: string }) => c.field)).toEqual(['alcoholPercentVolume', 'pH', 'titratableAcidityGPerL']);
    const [{ n: lotCount }] = await t.db.query('SELECT count(*)::int AS n FROM reference_lot WHERE library_version_id = $1 AND included', [red.versions[0].id]);
    expect(lotCount).toBeGreaterThanOrEqual(12);
    expect(res.body.lots).toHaveLength(lotCount);
    const cell = res.body.cells.find((c: { parameter: string; chemistry: string }) => c.parameter === 'r0' && c.chemistry === 'alcoholPercentVolume');
    const both = res.body.lots.filter((l: { chemistry: Record<string, number | null> }) => typeof l.chemistry.alcoholPercentVolume === 'number');
    const x = both.map((l: { parameters: Record<string, number> }) => l.parameters.r0);
    const y = both.map((l: { chemistry: Record<string, number> }) => l.chemistry.alcoholPercentVolume);
    expect(cell.r).toBeCloseTo(pearson(x, y).r, 12);
    expect(cell.n).toBe(both.length);
    // Fitted once, then read back from the cache.
    expect((await t.db.query(`SELECT count(*)::int AS n FROM lot_fit`))[0].n).toBeGreaterThanOrEqual(lotCount);
  });

  it('repeatability compares replicate distances with distances between lots', async () => {
    await analyseDemoSample(t, 'OP-4HXT-2B');
    const libs = (await request(t.app).get('/api/lab/libraries').set(await t.authFor('analyst'))).body.items;
    const red = libs.find((l: { product: { name: string } }) => l.product.name.startsWith('Ridgeline Red'));
    const res = await request(t.app).get(`/api/lab/validation/library-versions/${red.versions[0].id}/repeatability`).set(await t.authFor('analyst'));
    expect(res.status).toBe(200);
    expect(res.body.within.samples).toBeGreaterThanOrEqual(1);
    expect(res.body.within.count).toBe(3 + 48 * 3); // the measured sample's 3 pairs and the demo's 48 synthesised blind checks
    expect(res.body.synthesisedForDemo).toBe(true);
    const [{ n: lots }] = await t.db.query('SELECT count(*)::int AS n FROM reference_lot WHERE library_version_id = $1 AND included', [red.versions[0].id]);
    expect(res.body.between.count).toBe((lots * (lots - 1)) / 2); // every pair of lots once
    expect(res.body.ratio).toBeGreaterThan(1);
  });

  it('the detection study counts verdicts per level and names the lowest reliably detected level', async () => {
    const v = (verdict: string, n: number, level: number) => Array.from({ length: n }, () => ({ admixture: 'water' as const, admixtureName: 'tap water', levelPercent: level, verdict: verdict as 'consistent', synthesised: true }));
    const [s] = detectionSeries([...v('consistent', 10, 2), ...v('not-consistent', 19, 5), ...v('inconclusive', 1, 5), ...v('not-consistent', 20, 10), ...v('not-consistent', 4, 20)]);
    expect(s.levels.map((l) => [l.levelPercent, l.reliablyDetected])).toEqual([[2, false], [5, true], [10, true], [20, false]]);
    expect(s.lowestReliableLevelPercent).toBeNull(); // 20 % has only 4 trials: the chain from the top is broken
    const [t2] = detectionSeries([...v('not-consistent', 19, 5), ...v('inconclusive', 1, 5), ...v('not-consistent', 20, 10)]);
    expect(t2.lowestReliableLevelPercent).toBe(5); // 19/20 = 95 %

    const products = (await request(t.app).get('/api/lab/libraries').set(await t.authFor('analyst'))).body.items;
    const red = products.find((l: { product: { name: string } }) => l.product.name.startsWith('Ridgeline Red'));
    const res = await request(t.app).get(`/api/lab/validation/products/${red.product.id}/detection`).set(await t.authFor('analyst'));
    expect(res.status).toBe(200);
    expect(res.body.synthesisedForDemo).toBe(true);
    const water = res.body.series.find((x: { admixture: string }) => x.admixture === 'water');
    expect(water.levels.every((l: { total: number }) => l.total === 12)).toBe(true);
    expect(water.levels.at(-1).reliablyDetected).toBe(true);
  });

  it('a sample marked as a mixture joins the detection study with its analysis verdict', async () => {
    const analysisId = await analyseDemoSample(t, 'OP-7K3M-Q9');
    const [{ sample_id: sampleId, verdict }] = await t.db.query(`SELECT sample_id, verdict FROM analysis WHERE id = $1`, [analysisId]);
    const put = await request(t.app).put(`/api/lab/samples/${sampleId}/validation-flags`).set(await t.authFor('analyst'))
      .send({ blindCheck: true, mixture: { admixture: 'water', admixtureName: 'lab water', levelPercent: 7 } });
    expect(put.status).toBe(200);
    const [{ product_id: productId }] = await t.db.query(`SELECT o.product_id FROM sample s JOIN test_order o ON o.id = s.order_id WHERE s.id = $1`, [sampleId]);
    const res = await request(t.app).get(`/api/lab/validation/products/${productId}/detection`).set(await t.authFor('lab-admin'));
    const lab = res.body.series.find((x: { admixtureName: string }) => x.admixtureName === 'lab water');
    expect(lab.levels).toEqual([expect.objectContaining({ levelPercent: 7, total: 1 })]);
    const perf = await request(t.app).get('/api/lab/validation/ongoing-performance').set(await t.authFor('reviewer'));
    expect(perf.body.checks.some((c: { reference: string; verdict: string }) => c.reference === 'OP-7K3M-Q9' && c.verdict === verdict)).toBe(true);
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'sample.validation-flags' AND subject_id = $1`, [sampleId]);
    expect(audit.details).toMatchObject({ blindCheck: true });
  });
});

describe('ongoing performance: one-sided binomial test against scipy.stats.binomtest', () => {
  it.each(fixture.binomtest.filter((c) => c.p === 0.01).map((c) => [`${c.k} of ${c.n}`, c] as const))('%s', (_n, c) => {
    const v = performanceVerdict(c.n, c.k, 0.01);
    // fixtures/validation/generate.py: scipy.stats.binomtest(k, n, 0.01, alternative='greater').pvalue
    expect(Math.abs((v.pValue as number) - c.pvalue)).toBeLessThanOrEqual(Math.max(1e-11 * c.pvalue, 1e-14)); // relative, with an absolute floor for tiny p
    expect(v.warning !== null).toBe(c.pvalue < 0.05);
  });

  it('reports the demo’s blind checks against the 1 % promise', async () => {
    const res = await request(t.app).get('/api/lab/validation/ongoing-performance').set(await t.authFor('lab-admin'));
    expect(res.status).toBe(200);
    expect(res.body.promisedRate).toBeCloseTo(0.01, 12);
    expect(res.body.total).toBeGreaterThanOrEqual(48);
    expect(res.body.test).toMatch(/binomial/);
  });
});

describe('CSV downloads are safe against formula injection (OWASP CSV injection guidance)', () => {
  it('prefixes text cells starting with = + - @ tab or CR, and quotes where needed', () => {
    expect(['=1+1', '+A1', '-2+3', '@SUM(A1)', '\tx', '\rx'].map(csvCell)).toEqual(["'=1+1", "'+A1", "'-2+3", "'@SUM(A1)", "'\tx", '"\'\rx"']);
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell(-0.5)).toBe('-0.5');
    expect(toCsv(['a'], [[null]])).toBe('a\r\n\r\n');
  });

  it('a file named like a formula comes out as text in the runs CSV', async () => {
    const cellId = await newCell('CSV cell');
    await run(cellId, 700, { fileName: '=SUM(1+1)*cmd.csv' });
    const res = await request(t.app).get(`/api/lab/cells/${cellId}/standard-runs.csv`).set(await t.authFor('intake-technician'));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.text).toContain(`,'=SUM(1+1)*cmd.csv,`);
    expect(res.text).not.toMatch(/,=SUM/);
  });
});

describe('validation summary PDF', () => {
  it('renders a PDF with the caution, the studies and the control standards', async () => {
    const libs = (await request(t.app).get('/api/lab/libraries').set(await t.authFor('lab-admin'))).body.items;
    const red = libs.find((l: { product: { name: string } }) => l.product.name.startsWith('Ridgeline Red'));
    const res = await request(t.app).get(`/api/lab/validation/library-versions/${red.versions[0].id}/summary.pdf`).set(await t.authFor('lab-admin')).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect((res.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });
});

describe('roles and tenants on every validation route', () => {
  let ids: { cellId: string; versionId: string; productId: string; sampleId: string };
  beforeAll(async () => {
    const [cell] = await t.db.query(`SELECT c.id FROM measurement_cell c JOIN lab l ON l.id = c.lab_id WHERE l.name = 'Calder Analytical' ORDER BY c.name LIMIT 1`);
    const libs = (await request(t.app).get('/api/lab/libraries').set(await t.authFor('lab-admin'))).body.items;
    const [sample] = await t.db.query(`SELECT s.id FROM sample s JOIN lab l ON l.id = s.lab_id WHERE l.name = 'Calder Analytical' LIMIT 1`);
    ids = { cellId: cell.id, versionId: libs[0].versions[0].id, productId: libs[0].product.id, sampleId: sample.id };
  });

  const reads = () => [
    `/api/lab/cells/${ids.cellId}/control-chart`,
    `/api/lab/cells/${ids.cellId}/standard-runs.csv`,
    `/api/lab/validation/library-versions/${ids.versionId}/correlation`,
    `/api/lab/validation/library-versions/${ids.versionId}/correlation.csv`,
    `/api/lab/validation/library-versions/${ids.versionId}/repeatability`,
    `/api/lab/validation/library-versions/${ids.versionId}/summary.pdf`,
    `/api/lab/validation/products/${ids.productId}/detection`,
    `/api/lab/validation/products/${ids.productId}/detection.csv`,
    `/api/lab/samples/${ids.sampleId}/validation-flags`,
  ];

  it('answers 401 without sign-in and 403 to client users and the operator', async () => {
    for (const path of [...reads(), '/api/lab/validation/ongoing-performance']) {
      expect((await request(t.app).get(path)).status).toBe(401);
      expect((await request(t.app).get(path).set(await t.authFor('client-admin'))).status).toBe(403);
      expect((await request(t.app).get(path).set(await t.authFor('platform-operator'))).status).toBe(403);
    }
  });

  it('keeps the validation screens to lab admins, analysts and reviewers', async () => {
    const intake = await t.authFor('intake-technician');
    for (const path of reads().slice(2, 8)) expect((await request(t.app).get(path).set(intake)).status).toBe(403);
    expect((await request(t.app).get('/api/lab/validation/ongoing-performance').set(intake)).status).toBe(403);
  });

  it('lets only lab admins add equipment, and analysts or admins record runs and mark samples', async () => {
    expect((await request(t.app).post('/api/lab/cells').set(await t.authFor('analyst')).send({ name: 'X', nominalConstantPerCm: 1 })).status).toBe(403);
    expect((await request(t.app).post('/api/lab/instruments').set(await t.authFor('reviewer')).send({ name: 'X' })).status).toBe(403);
    const made = await request(t.app).post('/api/lab/instruments').set(await t.authFor('lab-admin')).send({ name: 'Analyser 9', model: 'M', serialNumber: 'S' });
    expect(made.status).toBe(201);
    const again = await request(t.app).post('/api/lab/instruments').set(await t.authFor('lab-admin')).send({ name: 'analyser 9' });
    expect(again.status).toBe(409);
    expect(again.body.errors[0].field).toBe('name');
    const rec = await request(t.app).post(`/api/lab/cells/${ids.cellId}/standard-runs`).set(await t.authFor('reviewer')).field('concentration', '0.01').field('basis', 'molal').field('temperatureC', '25').attach('file', Buffer.from(kclExport(700)), 'k.csv');
    expect(rec.status).toBe(403);
    expect((await request(t.app).put(`/api/lab/samples/${ids.sampleId}/validation-flags`).set(await t.authFor('intake-technician')).send({ blindCheck: true, mixture: null })).status).toBe(403);
  });

  it('answers 404 for another lab’s cell, version, product and sample', async () => {
    const other = await t.authFor('lab-admin', 'marlow');
    for (const path of reads()) expect((await request(t.app).get(path).set(other)).status).toBe(404);
    const rec = await request(t.app).post(`/api/lab/cells/${ids.cellId}/standard-runs`).set(await t.authFor('analyst', 'marlow')).field('concentration', '0.01').field('basis', 'molal').field('temperatureC', '25').attach('file', Buffer.from(kclExport(700)), 'k.csv');
    expect(rec.status).toBe(404);
    expect((await request(t.app).put(`/api/lab/samples/${ids.sampleId}/validation-flags`).set(other).send({ blindCheck: true, mixture: null })).status).toBe(404);
    const perf = await request(t.app).get('/api/lab/validation/ongoing-performance').set(other);
    expect(perf.body.checks.some((c: { reference: string }) => c.reference.startsWith('DEMO-BLIND'))).toBe(false);
  });
});
