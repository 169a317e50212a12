import request from 'supertest';
import { NEAREST_LOTS } from '@ohmprint/contracts';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { insertLargePublishedLibrary } from '../../../../../test/bench/fixtures/large-library';
import { measureDemoSample, useTestApp } from '../../testing';
import { approveAndIssue } from '../../testing/report-issuance';

jest.setTimeout(120_000);

const t = useTestApp();
const CODE = 'OP-9RWD-6F';
const LOTS = 3000;
let versionId: string;
let analysisId: string;
let run: request.Response;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const [ctx] = await t.db.query(
    `SELECT o.product_id, s.lab_id, (SELECT id FROM app_user WHERE email = 'admin@calder.test') AS admin_id
     FROM sample s JOIN test_order o ON o.id = s.order_id WHERE s.code = $1`,
    [CODE],
  );
  ({ versionId } = await t.db.transaction((m) => insertLargePublishedLibrary(m, { labId: ctx.lab_id, productId: ctx.product_id, lots: LOTS, publishedByUserId: ctx.admin_id })));
  const { sampleId } = await measureDemoSample(t, CODE);
  run = await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(await t.authFor('analyst')).send({ libraryVersionId: versionId });
  analysisId = run.body.id;
});

describe('an analysis against a library of thousands of lots', () => {
  it('returns a bounded result that still has all the screen and the report draw', async () => {
    expect(run.status).toBe(201);
    const r = run.body.result;
    // Bounded: the nearest lots only, not one entry per lot.
    expect(r.lotCount).toBe(LOTS);
    expect(r.distances).toHaveLength(NEAREST_LOTS);
    const d = r.distances.map((x: { distance: number }) => x.distance);
    expect(d).toEqual([...d].sort((a, b) => a - b));
    expect(r.distances[0]).toEqual(r.nearest);
    expect(r.map.lots).toHaveLength(NEAREST_LOTS);
    // The histogram: every calibration distance counted once, with the thresholds and the sample's bin.
    expect(r.histogram.counts.reduce((a: number, b: number) => a + b, 0)).toBe(LOTS);
    expect(r.histogram.binEdges).toHaveLength(r.histogram.counts.length + 1);
    expect(r.histogram).toMatchObject({ t95: r.t95, t99: r.t99, sampleDistance: r.nearest.distance });
    const bin = r.histogram.sampleBin;
    expect(r.nearest.distance).toBeGreaterThanOrEqual(r.histogram.binEdges[bin]);
    expect(r.nearest.distance).toBeLessThanOrEqual(r.histogram.binEdges[bin + 1]);
    // The band stored at publication, on the method grid, spanning every lot.
    const band = run.body.referenceBand;
    expect(band.lotCount).toBe(LOTS);
    expect(band.frequencyHz).toEqual(run.body.sampleSpectrum.frequencyHz);
    for (const k of ['reLow', 'reHigh', 'imLow', 'imHigh', 'modulusLow', 'modulusHigh', 'phaseLowDeg', 'phaseHighDeg']) expect(band[k]).toHaveLength(band.frequencyHz.length);
    band.reLow.forEach((low: number, i: number) => expect(low).toBeLessThanOrEqual(band.reHigh[i]));
    expect(Buffer.byteLength(JSON.stringify(run.body))).toBeLessThan(100_000);

    const again = await request(t.app).get(`/api/lab/analyses/${analysisId}`).set(await t.authFor('reviewer'));
    expect(again.body.result).toEqual(r);
  });

  it('pages through every lot distance exactly once, nearest first', async () => {
    const analyst = await t.authFor('analyst');
    const seen: { lotId: string; distance: number; rank: number }[] = [];
    let after: number | null = 0;
    let pages = 0;
    while (after !== null) {
      const res: request.Response = await request(t.app).get(`/api/lab/analyses/${analysisId}/lot-distances?after=${after}&limit=200`).set(analyst);
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(LOTS);
      expect(res.body.items.length).toBeLessThanOrEqual(200);
      seen.push(...res.body.items);
      after = res.body.next;
      pages++;
    }
    expect(pages).toBe(LOTS / 200);
    expect(seen.map((s) => s.rank)).toEqual(Array.from({ length: LOTS }, (_, i) => i + 1));
    expect(new Set(seen.map((s) => s.lotId)).size).toBe(LOTS);
    for (let i = 1; i < seen.length; i++) expect(seen[i].distance).toBeGreaterThanOrEqual(seen[i - 1].distance);
    // The first page is the analysis's own nearest lots.
    expect(seen.slice(0, NEAREST_LOTS).map(({ rank: _, ...d }) => d)).toEqual(run.body.result.distances);
    const [{ count }] = await t.db.query(`SELECT count(*)::int AS count FROM reference_lot WHERE library_version_id = $1 AND included`, [versionId]);
    expect(count).toBe(LOTS);
  });

  it('refuses a page larger than the cap and a negative start, naming the field', async () => {
    const analyst = await t.authFor('analyst');
    const big = await request(t.app).get(`/api/lab/analyses/${analysisId}/lot-distances?limit=201`).set(analyst);
    expect(big.status).toBe(400);
    expect(JSON.stringify(big.body)).toContain('limit');
    const neg = await request(t.app).get(`/api/lab/analyses/${analysisId}/lot-distances?after=-1`).set(analyst);
    expect(neg.status).toBe(400);
    expect(JSON.stringify(neg.body)).toContain('after');
    const past = await request(t.app).get(`/api/lab/analyses/${analysisId}/lot-distances?after=${LOTS + 10}`).set(analyst);
    expect(past.body).toEqual({ items: [], total: LOTS, next: null });
  });

  it('answers 404 to another lab, 403 to a client and 401 without sign-in', async () => {
    const path = `/api/lab/analyses/${analysisId}/lot-distances`;
    expect((await request(t.app).get(path).set(await t.authFor('analyst', 'marlow'))).status).toBe(404);
    expect((await request(t.app).get(path).set(await t.authFor('client-admin'))).status).toBe(403);
    expect((await request(t.app).get(path)).status).toBe(401);
    const band = `/api/lab/library-versions/${versionId}/reference-band`;
    expect((await request(t.app).get(band).set(await t.authFor('analyst', 'marlow'))).status).toBe(404);
    expect((await request(t.app).get(band).set(await t.authFor('intake-technician'))).status).toBe(403);
    const ok = await request(t.app).get(band).set(await t.authFor('reviewer'));
    expect(ok.status).toBe(200);
    expect(ok.body.band).toEqual(run.body.referenceBand);
  });

  it('still reproduces, every lot distance included', async () => {
    const res = await request(t.app).get(`/api/lab/analyses/${analysisId}/reproduce`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ reproduced: true, differences: [] });
    // A tampered stored distance is caught, at its lot.
    await t.db.query(`UPDATE analysis_lot_distance SET ranked = overlay(ranked PLACING '\\x0000000000000000'::bytea FROM 5 FOR 8) WHERE analysis_id = $1`, [analysisId]);
    const changed = await request(t.app).get(`/api/lab/analyses/${analysisId}/reproduce`).set(await t.authFor('reviewer'));
    expect(changed.body.reproduced).toBe(false);
    expect(changed.body.differences[0].field).toMatch(/^lotDistances\[\d+\]$/);
  });

  it('issues a report that keeps the bins and the band, not every calibration distance', async () => {
    // Reproduced above with a tampered distance: run again so the report is from an honest analysis.
    const [{ sample_id }] = await t.db.query(`SELECT sample_id FROM analysis WHERE id = $1`, [analysisId]);
    const fresh = await request(t.app).post(`/api/lab/samples/${sample_id}/analyses`).set(await t.authFor('analyst')).send({ libraryVersionId: versionId });
    await request(t.app).post(`/api/lab/analyses/${fresh.body.id}/submit`).set(await t.authFor('analyst'));
    const issued = await approveAndIssue(t, fresh.body.id);
    const [report] = await t.db.query(`SELECT content, octet_length(content::text) AS bytes FROM test_report WHERE id = $1`, [issued.id]);
    const plots = report.content.plots;
    expect(plots.calibrationDistances).toBeUndefined();
    expect(plots.calibrationHistogram).toEqual({ binEdges: fresh.body.result.histogram.binEdges, counts: fresh.body.result.histogram.counts });
    expect(plots.calibrationHistogram.counts.reduce((a: number, b: number) => a + b, 0)).toBe(LOTS);
    const band = fresh.body.referenceBand;
    expect(plots.referenceEnvelope).toEqual({ frequencyHz: band.frequencyHz, modulusMin: band.modulusLow, modulusMax: band.modulusHigh, phaseMinDeg: band.phaseLowDeg, phaseMaxDeg: band.phaseHighDeg, reMin: band.reLow, reMax: band.reHigh, imMin: band.imLow, imMax: band.imHigh });
    expect(plots.map.lots).toHaveLength(NEAREST_LOTS);
    expect(report.content.results.nearestLot).toBe(fresh.body.result.nearest.lotCode);
    expect(report.bytes).toBeLessThan(60_000);
  });
});
