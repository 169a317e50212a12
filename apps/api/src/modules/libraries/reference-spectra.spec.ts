import request from 'supertest';
import { spectrumDistance } from '@ohmprint/spectral-engine';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { measureDemoSample, useTestApp } from '../../testing';

jest.setTimeout(30_000);

const t = useTestApp();
const CODE = 'OP-9RWD-6F';
let versionId: string;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const [row] = await t.db.query(
    `SELECT v.id FROM library_version v JOIN reference_library l ON l.id = v.library_id JOIN test_order o ON o.product_id = l.product_id
     JOIN sample s ON s.order_id = o.id WHERE s.code = $1 AND v.status = 'published'`,
    [CODE],
  );
  versionId = row.id;
});

describe('reference spectra of a published library version', () => {
  it('gives every lot on the version grid, the same data the analysis scored the sample against', async () => {
    const analyst = await t.authFor('analyst');
    const { sampleId } = await measureDemoSample(t, CODE);
    const run = await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(analyst).send({ libraryVersionId: versionId });
    expect(run.status).toBe(201);

    const res = await request(t.app).get(`/api/lab/library-versions/${versionId}/reference-spectra`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ libraryVersionId: versionId, impedanceUnit: 'Ω·cm', referenceTemperatureC: 20 });
    const grid: number[] = res.body.frequencyHz;
    expect(grid).toHaveLength(run.body.method.gridPoints);
    expect(res.body.lots).toHaveLength(run.body.result.lotCount);
    for (const lot of res.body.lots) expect([lot.re.length, lot.im.length]).toEqual([grid.length, grid.length]);
    expect(run.body.sampleSpectrum.frequencyHz).toEqual(grid);

    // The nearest lot's distance recomputed from what the route returns must be the stored one.
    const nearest = run.body.result.nearest;
    const lot = res.body.lots.find((l: { lotId: string }) => l.lotId === nearest.lotId);
    const asSpectrum = (s: { re: number[]; im: number[] }) => ({ frequencyHz: Float64Array.from(grid), re: Float64Array.from(s.re), im: Float64Array.from(s.im) });
    expect(spectrumDistance(asSpectrum(run.body.sampleSpectrum), asSpectrum(lot))).toBeCloseTo(nearest.distance, 12);
  });

  it('is for analysts, reviewers and lab admins of the same lab only', async () => {
    const path = `/api/lab/library-versions/${versionId}/reference-spectra`;
    expect((await request(t.app).get(path).set(await t.authFor('lab-admin'))).status).toBe(200);
    expect((await request(t.app).get(path).set(await t.authFor('intake-technician'))).status).toBe(403);
    expect((await request(t.app).get(path).set(await t.authFor('client-admin'))).status).toBe(403);
    expect((await request(t.app).get(path).set(await t.authFor('analyst', 'marlow'))).status).toBe(404);
    expect((await request(t.app).get(path)).status).toBe(401);
  });

  it('is listed in the OpenAPI description', async () => {
    const spec = (await request(t.app).get('/api/openapi.json')).body;
    expect(Object.keys(spec.paths)).toContain('/api/lab/library-versions/{id}/reference-spectra');
  });
});
