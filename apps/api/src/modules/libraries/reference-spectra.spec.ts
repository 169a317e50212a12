import request from 'supertest';
import { spectrumDistance } from '@ohmprint/spectral-engine';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { demoFiles } from '../../../../../docker-free-scripts/seed/lab-demo-files';
import { useTestApp } from '../../testing';

jest.setTimeout(30_000);

const t = useTestApp();
const CODE = 'OP-9RWD-6F';
let versionId: string;
let sampleId: string;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  const [row] = await t.db.query(
    `SELECT s.id AS sample_id, v.id AS version_id FROM sample s JOIN test_order o ON o.id = s.order_id
     JOIN reference_library l ON l.product_id = o.product_id JOIN library_version v ON v.library_id = l.id AND v.status = 'published'
     WHERE s.code = $1`,
    [CODE],
  );
  versionId = row.version_id;
  sampleId = row.sample_id;
});

describe('reference spectra of a published library version', () => {
  it('gives every lot on the version grid, the same data the analysis scored the sample against', async () => {
    const analyst = await t.authFor('analyst');
    const bench = (await request(t.app).get('/api/lab/bench').set(analyst)).body;
    const files = demoFiles().filter((f) => f.sampleCode === CODE);
    let upload = request(t.app).post(`/api/lab/samples/${CODE}/measurements`).set(analyst)
      .field('instrumentId', bench.instruments[0].id).field('cellId', bench.cells[0].id).field('temperatureC', String(files[0].temperatureC));
    for (const f of files) upload = upload.attach('files', Buffer.from(f.text), f.fileName);
    expect((await upload).status).toBe(201);
    const run = await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(analyst).send({ libraryVersionId: versionId });
    expect(run.status).toBe(201);

    const res = await request(t.app).get(`/api/lab/library-versions/${versionId}/reference-spectra`).set(await t.authFor('reviewer'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ libraryVersionId: versionId, impedanceUnit: 'Ω·cm', referenceTemperatureC: 20 });
    const grid: number[] = res.body.frequencyHz;
    expect(grid).toHaveLength(run.body.method.gridPoints);
    expect(res.body.lots).toHaveLength(run.body.result.distances.length);
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
