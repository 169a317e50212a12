import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { enrolReferenceLots, useTestApp } from '../../testing';
import { probeOffThread } from '../../testing/off-thread-probe';
import { DEFAULT_METHOD } from './default-method';

/**
 * Issue 10, "Calibration grows as N² ... blocks every tenant": calibrating a library (building a
 * draft, and again whenever a lot is excluded or included) runs in the CPU pool, and the API keeps
 * answering health meanwhile. (Its cost at 50,000 lots is a benchmark figure, not a timed test;
 * the leave-one-out distances are checked against SciPy in test/reference/similarity.)
 */
jest.setTimeout(180_000);
const t = useTestApp();
let productId = '';
let methodVersionId = '';

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  ({ productId } = await enrolReferenceLots(t, { productName: 'Sunvale Quince (test)', matrix: 'juice', client: 'Sunvale Juice Works', profile: 'cloudy-apple', count: 7, prefix: 'Q', chemistry: true }));
  const admin = await t.authFor('lab-admin');
  methodVersionId = (await request(t.app).post('/api/lab/methods').set(admin).send({ name: 'Juice (off-thread test)', matrix: 'juice', settings: { ...DEFAULT_METHOD, model: 'cole-cole' } })).body.id;
});

describe('calibrating a library', () => {
  it('runs in the worker pool while health answers, when a draft is built and when a lot is excluded', async () => {
    const analyst = await t.authFor('analyst');
    const built = await probeOffThread(t.app, 'calibrateLibrary', () => request(t.app).post('/api/lab/library-drafts').set(analyst).send({ productId, methodVersionId }));
    expect(built.result.status).toBe(201);
    expect(built.result.body.lotCount).toBe(7);
    expect(built.tasks).toBeGreaterThanOrEqual(1);
    expect(built.healthAnswersDuringTask).toBeGreaterThanOrEqual(1);
    expect(built.maxStallMs).toBeLessThan(1500);

    const versionId = built.result.body.id;
    const [lot] = (await request(t.app).get(`/api/lab/library-versions/${versionId}/lots`).set(analyst)).body.items;
    const excluded = await probeOffThread(t.app, 'calibrateLibrary', () =>
      request(t.app).put(`/api/lab/library-versions/${versionId}/lots/${lot.id}/inclusion`).set(analyst).send({ included: false, reason: 'Seal broken on arrival (test)' }));
    expect(excluded.result.status).toBe(200);
    expect(excluded.result.body.calibration.lotCount).toBe(6);
    expect(excluded.tasks).toBeGreaterThanOrEqual(1);
    expect(excluded.healthAnswersDuringTask).toBeGreaterThanOrEqual(1);
    expect(excluded.maxStallMs).toBeLessThan(1500);
  });
});
