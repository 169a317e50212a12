import request from 'supertest';
import { demoFiles } from '../../../../docker-free-scripts/seed/lab-demo-files';
import type { TestApp } from './test-app';

export interface MeasuredDemoSample {
  sampleId: string;
  /** The published library version of the sample's product. */
  versionId: string;
}

/**
 * The analyst uploads every demo export of a seeded sample (the demo lab must be seeded), with the
 * lab's first instrument and cell at the temperature the exports were made for.
 */
export async function measureDemoSample(t: TestApp, code: string): Promise<MeasuredDemoSample> {
  const analyst = await t.authFor('analyst');
  const bench = (await request(t.app).get('/api/lab/bench').set(analyst)).body;
  const files = demoFiles().filter((f) => f.sampleCode === code);
  if (!files.length) throw new Error(`the demo has no exports for ${code}`);
  let upload = request(t.app)
    .post(`/api/lab/samples/${code}/measurements`)
    .set(analyst)
    .field('instrumentId', bench.instruments[0].id)
    .field('cellId', bench.cells[0].id)
    .field('temperatureC', String(files[0].temperatureC));
  for (const f of files) upload = upload.attach('files', Buffer.from(f.text), f.fileName);
  const res = await upload;
  if (res.status !== 201) throw new Error(`uploading ${code}'s exports answered ${res.status}: ${JSON.stringify(res.body)}`);
  const [row] = await t.db.query(
    `SELECT s.id AS sample_id, v.id AS version_id FROM sample s JOIN test_order o ON o.id = s.order_id
     JOIN reference_library l ON l.product_id = o.product_id JOIN library_version v ON v.library_id = l.id AND v.status = 'published'
     WHERE s.code = $1 ORDER BY v.version DESC LIMIT 1`,
    [code],
  );
  return { sampleId: row.sample_id, versionId: row.version_id };
}

/** Measures the sample, then the analyst runs its analysis against the published version; the analysis id. */
export async function analyseDemoSample(t: TestApp, code: string): Promise<string> {
  const { sampleId, versionId } = await measureDemoSample(t, code);
  const res = await request(t.app).post(`/api/lab/samples/${sampleId}/analyses`).set(await t.authFor('analyst')).send({ libraryVersionId: versionId });
  if (res.status !== 201) throw new Error(`analysing ${code} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body.id;
}
