import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { measureDemoSample, useTestApp } from '../../testing';

/**
 * Issue 10: "an analysis after a file with a 1e308 frequency was accepted (a `toFixed` of null)".
 * Such files are refused now (measurements/upload-abuse.spec.ts), but labs keep replicates stored
 * before that: their Kramers–Kronig residual could not be computed and was stored as null. An
 * analysis over such a replicate, and the measurements screen's list, must still answer — saying
 * the residual is not computable — rather than fail with a 500.
 */
jest.setTimeout(120_000);
const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

describe('a replicate stored with a residual that could not be computed', () => {
  it('is analysed with a warning that says so, and listed, never a 500', async () => {
    const { sampleId, versionId } = await measureDemoSample(t, 'OP-7K3M-Q9');
    const [replicate] = await t.db.query(`SELECT id, replicate_number, file_name FROM replicate WHERE sample_id = $1 ORDER BY replicate_number LIMIT 1`, [sampleId]);
    // what a file with absurd values left behind before it was refused at upload
    await t.db.query(
      `UPDATE replicate SET kramers_kronig = kramers_kronig || '{"passed": false, "maxResidualPercent": null}'::jsonb WHERE id = $1`,
      [replicate.id],
    );
    const analyst = await t.authFor('analyst');
    const analysis = await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(analyst).send({ libraryVersionId: versionId });
    expect(analysis.status).toBe(201);
    const flag = analysis.body.result.qualityFlags.find((f: { code: string }) => f.code === 'kk-failed');
    expect(flag.message).toBe(`Replicate ${replicate.replicate_number} (${replicate.file_name}) fails the Kramers–Kronig test: not computable > ${flag.message.match(/> ([\d.]+) %/)[1]} %.`);
    expect(flag.message).not.toMatch(/null|NaN|undefined/);

    const listed = await request(t.app).get(`/api/lab/samples/${sampleId}/measurements`).set(analyst);
    expect(listed.status).toBe(200);
  });
});
