import request from 'supertest';
import { DEFAULT_METHOD } from './default-method';
import { analyseDemoSample, enrolReferenceLots, useTestApp } from '../../testing';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';

jest.setTimeout(180_000);

const t = useTestApp();
let productId: string;
let methodVersionId: string;
let strictMethodVersionId: string;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  ({ productId } = await enrolReferenceLots(t, { productName: 'Sunvale Pear (test)', matrix: 'juice', client: 'Sunvale Juice Works', profile: 'cloudy-apple', count: 7, prefix: 'P', chemistry: true }));
  const admin = await t.authFor('lab-admin');
  const juice = { ...DEFAULT_METHOD, model: 'cole-cole' };
  methodVersionId = (await request(t.app).post('/api/lab/methods').set(admin).send({ name: 'Juice (test)', matrix: 'juice', settings: juice })).body.id;
  strictMethodVersionId = (await request(t.app).post('/api/lab/methods').set(admin).send({ name: 'Juice strict (test)', matrix: 'juice', settings: { ...juice, maxThresholdIntervalWidth: 0.05 } })).body.id;
});

const draftOf = async (mv = methodVersionId) => request(t.app).post('/api/lab/library-drafts').set(await t.authFor('analyst')).send({ productId, methodVersionId: mv });

describe('building a library from reference lots', () => {
  let versionId: string;

  it('refuses a method of another matrix, naming the field', async () => {
    const [milk] = await t.db.query(`SELECT mv.id FROM method_version mv JOIN method m ON m.id = mv.method_id WHERE m.matrix = 'milk' LIMIT 1`);
    const res = await draftOf(milk.id);
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'methodVersionId', message: 'is a method for milk' }]);
  });

  it('makes a draft with one lot per measured reference-lot sample, calibrated at once', async () => {
    const res = await draftOf();
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: 1, lotCount: 7, skipped: [] });
    versionId = res.body.id;
    const detail = await request(t.app).get(`/api/lab/library-versions/${versionId}`).set(await t.authFor('analyst'));
    expect(detail.body).toMatchObject({ status: 'draft', includedLotCount: 7, methodVersion: { id: methodVersionId, version: 1, name: 'Juice (test)' }, publishBlockers: [] });
    expect(detail.body.calibration).toMatchObject({ estimator: 'lognormal-ml', lotCount: 7, bootstrap: { resamples: 2000, confidenceLevel: 0.95, seed: 17025 } });
    expect(detail.body.calibration.t99Interval[0]).toBeLessThan(detail.body.calibration.t99Interval[1]);
    // each lot keeps the producer's own code from its sample's reference-lot declaration
    const codes: { lot_code: string; producer_lot_code: string | null; declared: string }[] = await t.db.query(
      `SELECT r.lot_code, r.producer_lot_code, s.reference_lot->>'lotCode' AS declared FROM reference_lot r JOIN sample s ON s.id = r.sample_id WHERE r.library_version_id = $1`,
      [versionId],
    );
    expect(codes).toHaveLength(7);
    for (const c of codes) expect(c.producer_lot_code).toBe(c.declared);
    expect((await draftOf()).status).toBe(409);
  });

  it('pages the lots server-side with each lot’s leave-one-out distance, typicality and chemistry', async () => {
    const res = await request(t.app).get(`/api/lab/library-versions/${versionId}/lots?pageSize=3&sort=distance&dir=desc`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 7, page: 1, pageSize: 3 });
    expect(res.body.items).toHaveLength(3);
    const [a, b] = res.body.items;
    expect(a.looDistance).toBeGreaterThanOrEqual(b.looDistance);
    expect(a.typicality).toBe(0); // the largest leave-one-out distance: no other lot's is larger
    expect(a.quality).toMatchObject({ replicates: 2, problems: [] });
    const withChemistry = await request(t.app).get(`/api/lab/library-versions/${versionId}/lots?q=P-LOT-001`).set(await t.authFor('reviewer'));
    expect(withChemistry.body.items[0]).toMatchObject({ lotCode: 'P-LOT-001', chemistry: { pH: 3.4 }, sampleCode: expect.stringMatching(/^OP-P/) });
  });

  it('draws the band, the standouts and the map, small whatever the size', async () => {
    const res = await request(t.app).get(`/api/lab/library-versions/${versionId}/overview`).set(await t.authFor('analyst'));
    expect(res.status).toBe(200);
    expect(res.body.frequencyHz).toHaveLength(DEFAULT_METHOD.gridPoints);
    expect(res.body.band.reLow.every((v: number, i: number) => v <= res.body.band.reHigh[i])).toBe(true);
    expect(res.body.standouts).toHaveLength(3);
    expect(res.body.map).toHaveLength(7);
  });

  it('excludes and includes a lot only with a reason, each change audited, and recalibrates', async () => {
    const analyst = await t.authFor('analyst');
    const lots = (await request(t.app).get(`/api/lab/library-versions/${versionId}/lots`).set(analyst)).body.items;
    const lot = lots[0];
    const path = `/api/lab/library-versions/${versionId}/lots/${lot.id}/inclusion`;
    const noReason = await request(t.app).put(path).set(analyst).send({ included: false });
    expect(noReason.status).toBe(400);
    expect(noReason.body.errors[0].field).toBe('reason');
    const out = await request(t.app).put(path).set(analyst).send({ included: false, reason: 'Cap found loose on arrival' });
    expect(out.status).toBe(200);
    expect(out.body).toMatchObject({ includedLotCount: 6, excludedLotCount: 1, calibration: { lotCount: 6 } });
    const back = await request(t.app).put(path).set(analyst).send({ included: true, reason: 'Cap checked: sealed' });
    expect(back.body.includedLotCount).toBe(7);
    const audit = await t.db.query(`SELECT action, details->>'reason' AS reason FROM audit_event WHERE subject_id = $1 ORDER BY created_at, action`, [lot.id]);
    expect(audit).toEqual([
      { action: 'library.lot-excluded', reason: 'Cap found loose on arrival' },
      { action: 'library.lot-included', reason: 'Cap checked: sealed' },
    ]);
  });

  it('refuses to publish with too few lots, saying why', async () => {
    const analyst = await t.authFor('analyst');
    const lots = (await request(t.app).get(`/api/lab/library-versions/${versionId}/lots`).set(analyst)).body.items;
    for (const lot of lots.slice(0, 3)) await request(t.app).put(`/api/lab/library-versions/${versionId}/lots/${lot.id}/inclusion`).set(analyst).send({ included: false, reason: 'Testing the minimum' });
    const res = await request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ type: 'urn:ohmprint:problem:library-not-publishable', reasons: 'too-few-lots' });
    expect(res.body.detail).toMatch(/4 lots are included; the method needs at least 5/);
    for (const lot of lots.slice(0, 3)) await request(t.app).put(`/api/lab/library-versions/${versionId}/lots/${lot.id}/inclusion`).set(analyst).send({ included: true, reason: 'Back in' });
  });

  it('lets only a reviewer or lab admin publish; published, the version and its lots are frozen', async () => {
    expect((await request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor('analyst'))).status).toBe(403);
    const res = await request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'published', lotCount: 7, thresholdEstimator: 'lognormal-ml' });
    await expect(t.db.query(`UPDATE library_version SET calibration = NULL WHERE id = $1`, [versionId])).rejects.toThrow(/frozen/);
    await expect(t.db.query(`UPDATE reference_lot SET included = false, exclusion_reason = 'x' WHERE library_version_id = $1`, [versionId])).rejects.toThrow(/frozen/);
    const lots = (await request(t.app).get(`/api/lab/library-versions/${versionId}/lots`).set(await t.authFor('analyst'))).body.items;
    const frozen = await request(t.app).put(`/api/lab/library-versions/${versionId}/lots/${lots[0].id}/inclusion`).set(await t.authFor('analyst')).send({ included: false, reason: 'Too late' });
    expect(frozen.status).toBe(409);
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE subject_id = $1 AND action = 'library.version-published'`, [versionId]);
    expect(audit.details).toMatchObject({ lots: 7, estimator: 'lognormal-ml' });
  });

  it('refuses to publish when a threshold’s interval is wider than the method allows, and a draft can be discarded', async () => {
    const draft = await draftOf(strictMethodVersionId);
    expect(draft.status).toBe(201);
    const detail = await request(t.app).get(`/api/lab/library-versions/${draft.body.id}`).set(await t.authFor('lab-admin'));
    expect(detail.body.version).toBe(2);
    expect(detail.body.publishBlockers.map((b: { code: string }) => b.code)).toContain('interval-too-wide');
    expect(detail.body.changes).toMatchObject({ previousVersion: 1, lotsAdded: [], lotsRemoved: [] });
    expect(detail.body.changes.methodDifferences).toEqual([{ field: 'maxThresholdIntervalWidth', label: 'Widest threshold interval (fraction of the threshold)', before: '1', after: '0.05' }]);
    const res = await request(t.app).post(`/api/lab/library-versions/${draft.body.id}/publish`).set(await t.authFor('lab-admin'));
    expect(res.status).toBe(409);
    expect(res.body.reasons).toMatch(/interval-too-wide/);
    expect(res.body.detail).toMatch(/interval of T99 \(.+\) spans \d+ % of T99; the method allows at most 5 %/);
    expect((await request(t.app).delete(`/api/lab/library-versions/${draft.body.id}`).set(await t.authFor('analyst'))).status).toBe(204);
    expect((await request(t.app).get(`/api/lab/library-versions/${draft.body.id}`).set(await t.authFor('analyst'))).status).toBe(404);
  });

  it('shows how well the method tells the producer’s juices apart', async () => {
    const res = await request(t.app).get(`/api/lab/library-versions/${versionId}/cross-product`).set(await t.authFor('analyst'));
    expect(res.status).toBe(200);
    expect(res.body.products.map((p: { name: string }) => p.name)).toEqual(['Sunvale Pear (test)', 'Sunvale Cloudy Apple (demo)']);
    const total = res.body.confusion.flat().reduce((a: number, b: number) => a + b, 0);
    expect(total).toBe(7 + 40);
    expect(res.body.confusion[0][0] + res.body.confusion[0][1]).toBe(7);
    expect(res.body.confused).toHaveLength(total - res.body.confusion[0][0] - res.body.confusion[1][1]);
  });
});

describe('retiring a version', () => {
  it('keeps earlier analyses reproducible and says the version is retired; new analyses are refused', async () => {
    const analysisId = await analyseDemoSample(t, 'OP-6TBS-3H');
    const analyst = await t.authFor('analyst');
    const view = await request(t.app).get(`/api/lab/analyses/${analysisId}`).set(analyst);
    expect(view.body.result.thresholds).toMatchObject({ estimator: 'lognormal-ml', lotCount: 40 });
    const versionId = view.body.libraryVersion.id;
    expect((await request(t.app).post(`/api/lab/library-versions/${versionId}/retire`).set(analyst).send({ reason: 'x' })).status).toBe(403);
    expect((await request(t.app).post(`/api/lab/library-versions/${versionId}/retire`).set(await t.authFor('reviewer')).send({ reason: '' })).status).toBe(400);
    const res = await request(t.app).post(`/api/lab/library-versions/${versionId}/retire`).set(await t.authFor('reviewer')).send({ reason: 'Replaced by a larger library' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'retired', retirementReason: 'Replaced by a larger library', retiredBy: { displayName: expect.any(String) } });
    await expect(t.db.query(`UPDATE library_version SET calibration = NULL WHERE id = $1`, [versionId])).rejects.toThrow(/frozen/);

    const again = await request(t.app).get(`/api/lab/analyses/${analysisId}`).set(analyst);
    expect(again.body.libraryVersion.retired).toBe(true);
    const check = await request(t.app).get(`/api/lab/analyses/${analysisId}/reproduce`).set(analyst);
    expect(check.status).toBe(200);
    expect(check.body).toMatchObject({ reproduced: true, differences: [] });
    const refused = await request(t.app).post(`/api/lab/samples/${view.body.sample.id}/analyses`).set(analyst).send({ libraryVersionId: versionId });
    expect(refused.status).toBe(409);
    expect(refused.body.type).toBe('urn:ohmprint:problem:library-version-retired');
    expect((await request(t.app).post(`/api/lab/library-versions/${versionId}/retire`).set(await t.authFor('reviewer')).send({ reason: 'Twice' })).status).toBe(409);
  });
});

describe('role and tenant checks on every library route', () => {
  const routes = (v: string, lot: string) => [
    { method: 'get' as const, path: '/api/lab/library-products', denied: 'intake-technician' as const },
    { method: 'post' as const, path: '/api/lab/library-drafts', body: { productId, methodVersionId }, denied: 'reviewer' as const },
    { method: 'get' as const, path: `/api/lab/library-versions/${v}/lots`, denied: 'intake-technician' as const },
    { method: 'get' as const, path: `/api/lab/library-versions/${v}/overview`, denied: 'intake-technician' as const },
    { method: 'get' as const, path: `/api/lab/library-versions/${v}/cross-product`, denied: 'intake-technician' as const },
    { method: 'put' as const, path: `/api/lab/library-versions/${v}/lots/${lot}/inclusion`, body: { included: false, reason: 'test' }, denied: 'reviewer' as const },
    { method: 'post' as const, path: `/api/lab/library-versions/${v}/calibrate`, denied: 'intake-technician' as const },
    { method: 'post' as const, path: `/api/lab/library-versions/${v}/publish`, denied: 'analyst' as const },
    { method: 'post' as const, path: `/api/lab/library-versions/${v}/retire`, body: { reason: 'test' }, denied: 'analyst' as const },
    { method: 'delete' as const, path: `/api/lab/library-versions/${v}`, denied: 'reviewer' as const },
  ];

  it('answers 401 signed out, 403 to a role without the right, 403 to clients and 404 to another lab', async () => {
    const [row] = await t.db.query(`SELECT r.id AS lot, r.library_version_id AS v FROM reference_lot r JOIN library_version v ON v.id = r.library_version_id WHERE v.status = 'published' LIMIT 1`);
    for (const r of routes(row.v, row.lot)) {
      const send = (headers: Record<string, string>) => request(t.app)[r.method](r.path).set(headers).send(r.body ?? {});
      expect([r.path, (await request(t.app)[r.method](r.path).send(r.body ?? {})).status]).toEqual([r.path, 401]);
      expect([r.path, (await send(await t.authFor(r.denied))).status]).toEqual([r.path, 403]);
      expect([r.path, (await send(await t.authFor('client-admin'))).status]).toEqual([r.path, 403]);
      if (r.path !== '/api/lab/library-drafts' && r.path !== '/api/lab/library-products') {
        const other = r.denied === 'analyst' || r.path.endsWith('/lots') || r.path.endsWith('overview') || r.path.endsWith('cross-product') || r.path.endsWith('calibrate') ? 'lab-admin' : 'analyst';
        expect([r.path, (await send(await t.authFor(other, 'marlow'))).status]).toEqual([r.path, 404]);
      }
    }
    const mine = await request(t.app).get('/api/lab/library-products?q=pear').set(await t.authFor('analyst'));
    expect(mine.body.items).toEqual([expect.objectContaining({ name: 'Sunvale Pear (test)', measuredLots: 7 })]);
    const theirs = await request(t.app).get('/api/lab/library-products?q=pear').set(await t.authFor('analyst', 'marlow'));
    expect(theirs.body.items).toEqual([]);
    const foreign = await request(t.app).post('/api/lab/library-drafts').set(await t.authFor('analyst', 'marlow')).send({ productId, methodVersionId });
    expect(foreign.status).toBe(404);
  });
});
