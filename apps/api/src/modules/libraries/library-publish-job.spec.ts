import request from 'supertest';
import { config } from '../../config';
import { DEFAULT_METHOD } from './default-method';
import { publishLibraryVersion } from './library-publish-job';
import { enrolReferenceLots, useTestApp } from '../../testing';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';

jest.setTimeout(180_000);

const t = useTestApp();
let productId: string;
let methodVersionId: string;
let strictMethodVersionId: string;
const threshold = config.jobs.libraryPublishLots;

beforeAll(async () => {
  // Drafts of this file have 7 lots: above 3, they are published by the worker.
  config.jobs.libraryPublishLots = 3;
  await t.db.transaction((m) => seedLabDemo(m));
  ({ productId } = await enrolReferenceLots(t, { productName: 'Hollin Pear (test)', matrix: 'juice', client: 'Sunvale Juice Works', profile: 'cloudy-apple', count: 7, prefix: 'H', chemistry: true }));
  const admin = await t.authFor('lab-admin');
  const juice = { ...DEFAULT_METHOD, model: 'cole-cole' };
  methodVersionId = (await request(t.app).post('/api/lab/methods').set(admin).send({ name: 'Juice (jobs test)', matrix: 'juice', settings: juice })).body.id;
  strictMethodVersionId = (await request(t.app).post('/api/lab/methods').set(admin).send({ name: 'Juice strict (jobs test)', matrix: 'juice', settings: { ...juice, maxThresholdIntervalWidth: 0.05 } })).body.id;
});

afterAll(() => {
  config.jobs.libraryPublishLots = threshold;
});

const draftOf = async (mv: string) => {
  const res = await request(t.app).post('/api/lab/library-drafts').set(await t.authFor('analyst')).send({ productId, methodVersionId: mv });
  expect(res.status).toBe(201);
  return res.body.id as string;
};
const publish = async (versionId: string, role: 'reviewer' | 'lab-admin' = 'reviewer') => request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor(role));
const publication = async (versionId: string) => request(t.app).get(`/api/lab/library-versions/${versionId}/publication`).set(await t.authFor('analyst'));
const audits = async (versionId: string) => t.db.query(`SELECT details FROM audit_event WHERE subject_id = $1 AND action = 'library.version-published'`, [versionId]);

describe('publishing a large library version as a job', () => {
  let versionId: string;

  it('answers 202 queued, and the worker publishes it with its band and one audit entry', async () => {
    versionId = await draftOf(methodVersionId);
    expect((await publication(versionId)).body).toMatchObject({ state: 'draft', lotCount: 7 });
    const res = await publish(versionId);
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ versionId, version: expect.any(Number), state: 'queued', lotCount: 7, detail: null });
    await t.jobsIdle(60_000);
    expect((await publication(versionId)).body).toMatchObject({ state: 'published', lotCount: 7, detail: null });
    const detail = await request(t.app).get(`/api/lab/library-versions/${versionId}`).set(await t.authFor('analyst'));
    expect(detail.body).toMatchObject({ status: 'published', lotCount: 7 });
    const band = await request(t.app).get(`/api/lab/library-versions/${versionId}/reference-band`).set(await t.authFor('analyst'));
    expect(band.status).toBe(200);
    const [audit] = await audits(versionId);
    expect(audit.details).toMatchObject({ lots: 7 });
    expect(await audits(versionId)).toHaveLength(1);
    expect((await publish(versionId)).status).toBe(409);
  });

  it('publishes once when the job runs again (a retry or a second worker)', async () => {
    const [before] = await t.db.query('SELECT lab_id, published_at FROM library_version WHERE id = $1', [versionId]);
    expect(await publishLibraryVersion({ labId: before.lab_id, versionId, userId: await t.userIdFor('lab-admin') })).toEqual({ published: false });
    const [after] = await t.db.query('SELECT published_at FROM library_version WHERE id = $1', [versionId]);
    expect(after.published_at).toEqual(before.published_at);
    expect(await audits(versionId)).toHaveLength(1);
  });

  it('publishes once when two people press publish at the same moment', async () => {
    const second = await draftOf(methodVersionId);
    const [a, b] = await Promise.all([publish(second, 'reviewer'), publish(second, 'lab-admin')]);
    expect([a.status, b.status]).toEqual([202, 202]);
    for (const r of [a, b]) expect(['queued', 'running']).toContain(r.body.state);
    await t.jobsIdle(60_000);
    expect((await publication(second)).body.state).toBe('published');
    expect(await audits(second)).toHaveLength(1);
    const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'library-publish' AND singleton_key = $1`, [second]);
    expect(n).toBeLessThanOrEqual(2);
  });

  it('shows why the method refused the draft, publishes nothing, and a new press tries again', async () => {
    const strict = await draftOf(strictMethodVersionId);
    expect((await publish(strict, 'lab-admin')).status).toBe(202);
    await t.jobsIdle(60_000);
    const failed = (await publication(strict)).body;
    expect(failed).toMatchObject({ state: 'failed', lotCount: 7 });
    expect(failed.detail).toMatch(/interval of T99 .* spans \d+ % of T99; the method allows at most 5 %/);
    const again = await publish(strict, 'lab-admin');
    expect(again.status).toBe(202);
    expect(again.body.state).toBe('queued');
    expect(['queued', 'running', 'failed']).toContain((await publication(strict)).body.state); // the worker may already have it
    await t.jobsIdle(60_000);
    expect((await publication(strict)).body.state).toBe('failed');
    const [{ status }] = await t.db.query('SELECT status FROM library_version WHERE id = $1', [strict]);
    expect(status).toBe('draft');
    expect(await audits(strict)).toHaveLength(0);
    await request(t.app).delete(`/api/lab/library-versions/${strict}`).set(await t.authFor('lab-admin'));
  });

  it('says why when every attempt of the worker failed, and publishing again succeeds', async () => {
    const draft = await draftOf(methodVersionId);
    // a job the worker gave up on (its last error kept by the job system), as after repeated crashes
    // (its error names a table: that stays in the worker's log, never shown to the lab)
    const [job] = await t.db.query(
      `INSERT INTO pgboss.job (name, data, state, singleton_key, output) VALUES ('library-publish', '{}', 'failed', $1, '{"message":"relation \\"library_version_band\\" is locked"}') RETURNING id`,
      [draft],
    );
    const failed = (await publication(draft)).body;
    expect(failed).toMatchObject({ state: 'failed', lotCount: 7 });
    expect(failed.detail).toBe(`Publishing stopped after several attempts (job ${job.id}; the cause is in the worker's log). Press publish to try again.`);
    expect((await publish(draft)).status).toBe(202);
    await t.jobsIdle(60_000);
    expect((await publication(draft)).body).toMatchObject({ state: 'published', detail: null });
    expect(await audits(draft)).toHaveLength(1);
  });

  it('checks role and tenant on the status and the publish routes', async () => {
    const path = `/api/lab/library-versions/${versionId}/publication`;
    expect((await request(t.app).get(path)).status).toBe(401);
    expect((await request(t.app).get(path).set(await t.authFor('client-admin'))).status).toBe(403);
    for (const role of ['analyst', 'reviewer', 'lab-admin'] as const) expect((await request(t.app).get(path).set(await t.authFor(role))).status).toBe(200);
    expect((await request(t.app).get(path).set(await t.authFor('reviewer', 'marlow'))).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor('lab-admin', 'marlow'))).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/library-versions/${versionId}/publish`).set(await t.authFor('analyst'))).status).toBe(403);
    expect((await request(t.app).get('/api/lab/library-versions/not-a-uuid/publication').set(await t.authFor('analyst'))).status).toBe(400);
  });
});
