import request from 'supertest';
import { config } from '../../config';
import { measureDemoSample, useTestApp } from '../../testing';
import { runRequestedAnalysis } from './analysis-run-job';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';

jest.setTimeout(180_000);

const t = useTestApp();
const threshold = config.jobs.analysisLots;
let sampleId: string;
let versionId: string;
let lots: number;

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
  ({ sampleId, versionId } = await measureDemoSample(t, 'OP-6TBS-3H'));
  [{ n: lots }] = await t.db.query('SELECT count(*)::int AS n FROM reference_lot WHERE library_version_id = $1 AND included', [versionId]);
  // the demo library is small: any version above 1 lot is scored by the worker in this file
  config.jobs.analysisLots = 1;
});

afterAll(() => {
  config.jobs.analysisLots = threshold;
});

const analyse = async (body: object = { libraryVersionId: versionId }) => request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(await t.authFor('analyst')).send(body);
const runOf = async (role: 'analyst' | 'reviewer' = 'analyst') => request(t.app).get(`/api/lab/samples/${sampleId}/analysis-run`).set(await t.authFor(role));
const analysesOfSample = async () => t.db.query(`SELECT id, status FROM analysis WHERE sample_id = $1 ORDER BY created_at`, [sampleId]);

describe('analysing against a large library on a worker', () => {
  it('answers 202 queued, and the worker stores one analysis the status then points to', async () => {
    expect((await runOf()).body).toMatchObject({ state: 'idle', analysisId: null });
    const res = await analyse();
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ sampleId, libraryVersionId: versionId, state: 'queued', lotCount: lots, analysisId: null, detail: null });
    await t.jobsIdle(60_000);
    const done = (await runOf('reviewer')).body;
    expect(done).toMatchObject({ state: 'done', lotCount: lots, detail: null });
    const analysis = await request(t.app).get(`/api/lab/analyses/${done.analysisId}`).set(await t.authFor('analyst'));
    expect(analysis.status).toBe(200);
    expect(analysis.body).toMatchObject({ id: done.analysisId, status: 'draft', sample: { id: sampleId }, libraryVersion: { id: versionId }, result: { verdict: expect.any(String) } });
    expect(await analysesOfSample()).toEqual([{ id: done.analysisId, status: 'draft' }]);
  });

  it('a retried job finds the analysis it stored and runs nothing again', async () => {
    const [before] = await analysesOfSample();
    const [{ lab_id: labId }] = await t.db.query('SELECT lab_id FROM sample WHERE id = $1', [sampleId]);
    const auth = { userId: await t.userIdFor('analyst'), email: '', displayName: '', labId, roles: ['analyst' as const], clientOrganisationId: null };
    const again = await runRequestedAnalysis({ labId, sampleId, libraryVersionId: versionId, auth, requestedAt: new Date(Date.now() - 60_000).toISOString() });
    expect(again).toEqual({ analysisId: before.id });
    expect(await analysesOfSample()).toHaveLength(1);
  });

  it('two presses at the same moment give one new analysis', async () => {
    const [a, b] = await Promise.all([analyse(), analyse()]);
    expect([a.status, b.status]).toEqual([202, 202]);
    await t.jobsIdle(60_000);
    const rows = await analysesOfSample();
    expect(rows).toHaveLength(2); // the first, now superseded, and exactly one new draft
    expect(rows.map((r: { status: string }) => r.status)).toEqual(['superseded', 'draft']);
    expect((await runOf()).body).toMatchObject({ state: 'done', analysisId: rows[1].id });
    const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM audit_event WHERE action = 'analysis.run' AND details->>'sampleCode' = 'OP-6TBS-3H'`);
    expect(n).toBe(2);
  });

  it('shows why the worker refused, stores nothing, and a new press tries again', async () => {
    await t.db.query(`UPDATE replicate SET excluded = true, exclusion_reason = 'set aside for the jobs test' WHERE sample_id = $1`, [sampleId]);
    try {
      expect((await analyse()).status).toBe(202);
      await t.jobsIdle(60_000);
      const failed = (await runOf()).body;
      expect(failed).toMatchObject({ state: 'failed', analysisId: null });
      expect(failed.detail).toBe('Sample OP-6TBS-3H has no included replicates; upload measurements first.');
      expect(await analysesOfSample()).toHaveLength(2);
    } finally {
      await t.db.query(`UPDATE replicate SET excluded = false, exclusion_reason = NULL WHERE sample_id = $1`, [sampleId]);
    }
    expect((await analyse()).status).toBe(202);
    await t.jobsIdle(60_000);
    expect((await runOf()).body.state).toBe('done');
    expect(await analysesOfSample()).toHaveLength(3);
  });

  it('says why when every attempt of the worker failed, and running it again succeeds', async () => {
    // a job the worker gave up on (its last error kept by the job system), as after repeated crashes
    // (its error names a constraint: that stays in the worker's log, never shown to the lab)
    const [job] = await t.db.query(
      `INSERT INTO pgboss.job (name, data, state, singleton_key, output) VALUES ('analysis-run', $1, 'failed', $2, '{"message":"duplicate key value violates unique constraint \\"analysis_pkey\\""}') RETURNING id`,
      [JSON.stringify({ libraryVersionId: versionId }), sampleId],
    );
    expect((await runOf()).body).toMatchObject({
      state: 'failed', libraryVersionId: versionId, lotCount: lots, analysisId: null,
      detail: `The analysis stopped after several attempts (job ${job.id}; the cause is in the worker's log). Run it again to retry.`,
    });
    expect((await analyse()).status).toBe(202);
    await t.jobsIdle(60_000);
    expect((await runOf()).body.state).toBe('done');
    expect(await analysesOfSample()).toHaveLength(4);
  });

  it('checks role and tenant on the status and the analyse routes', async () => {
    const path = `/api/lab/samples/${sampleId}/analysis-run`;
    expect((await request(t.app).get(path)).status).toBe(401);
    expect((await request(t.app).get(path).set(await t.authFor('client-admin'))).status).toBe(403);
    expect((await request(t.app).get(path).set(await t.authFor('analyst', 'marlow'))).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(await t.authFor('analyst', 'marlow')).send({ libraryVersionId: versionId })).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(await t.authFor('reviewer')).send({ libraryVersionId: versionId })).status).toBe(403);
  });
});
