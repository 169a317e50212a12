import request from 'supertest';
import { DEFAULT_METHOD } from './default-method';
import { analyseDemoSample, approveAndIssue, measureDemoSample, useTestApp } from '../../testing';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';

jest.setTimeout(120_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

const vinegar = { name: 'Vinegar screening', matrix: 'vinegar', settings: { ...DEFAULT_METHOD, model: 'cole-cole' }, note: 'First version' };

describe('methods', () => {
  let methodId: string;
  let v1: string;

  it('lets a lab admin define a method; its version 1 lists no differences', async () => {
    const res = await request(t.app).post('/api/lab/methods').set(await t.authFor('lab-admin')).send(vinegar);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Vinegar screening', matrix: 'vinegar', version: 1, locked: false, differences: [], previousVersion: null });
    methodId = res.body.methodId;
    v1 = res.body.id;
    const [audit] = await t.db.query(`SELECT action FROM audit_event WHERE subject_id = $1`, [v1]);
    expect(audit.action).toBe('method.created');
  });

  it('refuses a second method of the same name, naming the field', async () => {
    const res = await request(t.app).post('/api/lab/methods').set(await t.authFor('lab-admin')).send({ ...vinegar, name: 'VINEGAR screening' });
    expect(res.status).toBe(409);
    expect(res.body.errors).toEqual([{ field: 'name', message: 'is already used by another method' }]);
  });

  it('refuses a model the engine cannot read, naming settings.model', async () => {
    const res = await request(t.app).post('/api/lab/methods').set(await t.authFor('lab-admin')).send({ ...vinegar, name: 'Broken', settings: { ...vinegar.settings, model: 'R0 + system("x")' } });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].field).toBe('settings.model');
  });

  it('accepts a lab expression as the model', async () => {
    const settings = { ...vinegar.settings, model: 'Rs + R / (1 + (j*omega*tau)^a)' };
    const res = await request(t.app).post('/api/lab/methods').set(await t.authFor('lab-admin')).send({ ...vinegar, name: 'Vinegar by expression', settings });
    expect(res.status).toBe(201);
    expect(res.body.settings.model).toBe(settings.model);
  });

  it('makes a change a new version and says what differs; an unchanged save is refused', async () => {
    const admin = await t.authFor('lab-admin');
    const changed = { settings: { ...vinegar.settings, minimumLots: 8, thresholdEstimator: 'empirical-type7' }, note: 'More lots' };
    const res = await request(t.app).post(`/api/lab/methods/${methodId}/versions`).set(admin).send(changed);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: 2, previousVersion: 1 });
    expect(res.body.differences).toEqual([
      { field: 'thresholdEstimator', label: 'Threshold estimator', before: 'Lognormal fitted by maximum likelihood', after: 'Empirical quantile (Hyndman–Fan type 7)' },
      { field: 'minimumLots', label: 'Minimum lots per library', before: '5', after: '8' },
    ]);
    const again = await request(t.app).post(`/api/lab/methods/${methodId}/versions`).set(admin).send(changed);
    expect(again.status).toBe(409);
    const list = await request(t.app).get('/api/lab/methods?q=vinegar').set(await t.authFor('analyst'));
    expect(list.body.items.find((m: { id: string }) => m.id === methodId).versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
  });

  it('corrects a version in place while nothing relies on it', async () => {
    const res = await request(t.app).put(`/api/lab/method-versions/${v1}`).set(await t.authFor('lab-admin')).send({ settings: { ...vinegar.settings, gridPoints: 45 }, note: 'Corrected grid' });
    expect(res.status).toBe(200);
    expect(res.body.settings.gridPoints).toBe(45);
  });

  it('locks a version once a published library was built under it (409), and the database refuses it once a report used it', async () => {
    const [wine] = await t.db.query(
      `SELECT mv.id FROM method_version mv JOIN method m ON m.id = mv.method_id WHERE m.name = 'Wine screening (demo)' AND mv.version = 2`,
    );
    const admin = await t.authFor('lab-admin');
    const detail = await request(t.app).get(`/api/lab/method-versions/${wine.id}`).set(admin);
    expect(detail.body).toMatchObject({ locked: true, lockReason: expect.stringMatching(/Published library versions/) });
    const put = await request(t.app).put(`/api/lab/method-versions/${wine.id}`).set(admin).send({ settings: detail.body.settings, note: 'sneaky' });
    expect(put.status).toBe(409);
    expect(put.body.type).toBe('urn:ohmprint:problem:method-version-locked');

    // Before any report: the trigger lets a direct change through (the API's own rule is the 409 above).
    await t.db.query(`UPDATE method_version SET note = note WHERE id = $1`, [wine.id]);
    const analysisId = await analyseDemoSample(t, 'OP-7K3M-Q9');
    expect((await request(t.app).post(`/api/lab/analyses/${analysisId}/submit`).set(await t.authFor('analyst'))).status).toBe(200);
    await approveAndIssue(t, analysisId, '');
    await expect(t.db.query(`UPDATE method_version SET note = 'changed' WHERE id = $1`, [wine.id])).rejects.toThrow(/used by an issued report/);
    await expect(t.db.query(`DELETE FROM method_version WHERE id = $1`, [wine.id])).rejects.toThrow(/used by an issued report/);
    const after = await request(t.app).get(`/api/lab/method-versions/${wine.id}`).set(admin);
    expect(after.body.lockReason).toMatch(/Issued reports \(1\)/);
  });

  it('previews the model on a real spectrum, prepared as the method prepares it', async () => {
    await measureDemoSample(t, 'OP-9RWD-6F');
    const admin = await t.authFor('lab-admin');
    const choices = await request(t.app).get('/api/lab/methods/preview-replicates').set(admin);
    expect(choices.status).toBe(200);
    const pick = choices.body.find((c: { sampleCode: string }) => c.sampleCode === 'OP-9RWD-6F');
    const res = await request(t.app).post('/api/lab/methods/model-preview').set(admin).send({ replicateId: pick.replicateId, settings: { ...DEFAULT_METHOD, model: 'cole-cole' } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ converged: true, sampleCode: 'OP-9RWD-6F', impedanceUnit: 'Ω·cm' });
    expect(res.body.frequencyHz).toHaveLength(DEFAULT_METHOD.gridPoints);
    expect(res.body.fitted.re).toHaveLength(DEFAULT_METHOD.gridPoints);
    // The fit follows the data: within a few per cent at every point.
    res.body.fitted.re.forEach((v: number, i: number) => expect(Math.abs(v - res.body.measured.re[i]) / Math.abs(res.body.measured.re[i])).toBeLessThan(0.05));
  });

  it('checks role and tenant on every method route', async () => {
    const analyst = await t.authFor('analyst');
    const client = await t.authFor('client-admin');
    const otherAdmin = await t.authFor('lab-admin', 'marlow');
    expect((await request(t.app).post('/api/lab/methods').set(analyst).send(vinegar)).status).toBe(403);
    expect((await request(t.app).post(`/api/lab/methods/${methodId}/versions`).set(analyst).send(vinegar)).status).toBe(403);
    expect((await request(t.app).put(`/api/lab/method-versions/${v1}`).set(analyst).send(vinegar)).status).toBe(403);
    expect((await request(t.app).get('/api/lab/methods').set(client)).status).toBe(403);
    expect((await request(t.app).get('/api/lab/methods/model-catalog').set(client)).status).toBe(403);
    expect((await request(t.app).get('/api/lab/methods/preview-replicates').set(await t.authFor('reviewer'))).status).toBe(403);
    expect((await request(t.app).post('/api/lab/methods/model-preview').set(client).send({})).status).toBe(403);
    expect((await request(t.app).get(`/api/lab/method-versions/${v1}`)).status).toBe(401);
    expect((await request(t.app).get(`/api/lab/method-versions/${v1}`).set(otherAdmin)).status).toBe(404);
    expect((await request(t.app).post(`/api/lab/methods/${methodId}/versions`).set(otherAdmin).send({ settings: vinegar.settings })).status).toBe(404);
    expect((await request(t.app).put(`/api/lab/method-versions/${v1}`).set(otherAdmin).send({ settings: vinegar.settings })).status).toBe(404);
    const others = await request(t.app).get('/api/lab/methods').set(otherAdmin);
    expect(others.body.items.map((m: { name: string }) => m.name)).not.toContain('Vinegar screening');
    const [replicate] = await t.db.query(`SELECT id FROM replicate LIMIT 1`);
    expect((await request(t.app).post('/api/lab/methods/model-preview').set(otherAdmin).send({ replicateId: replicate.id, settings: vinegar.settings })).status).toBe(404);
  });
});
