import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { analyseDemoSample, approveAndIssue, useTestApp } from '../../testing';
import { DEMO_MARK } from '../reports/pdf/report-wording';

// Issuing the first report creates the lab's signing credential, which takes seconds.
jest.setTimeout(60_000);

const t = useTestApp();
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-demo-mark-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

/** Measures, analyses, submits and approves one demo sample; the issued PDF's text. */
async function reportText(code: string): Promise<string> {
  const analyst = await t.authFor('analyst');
  const id = await analyseDemoSample(t, code);
  await request(t.app).put(`/api/lab/analyses/${id}/remarks`).set(analyst).send({ remarks: 'Checked.' });
  expect((await request(t.app).post(`/api/lab/analyses/${id}/submit`).set(analyst)).status).toBe(200);
  const issued = await approveAndIssue(t, id);
  const [report] = await t.db.query('SELECT pdf FROM test_report WHERE id = $1', [issued.id]);
  const file = join(dir, `${code}.pdf`);
  writeFileSync(file, report.pdf);
  return execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

describe('demonstration mark on issued reports', () => {
  it('marks every report of a demo lab and none of a lab that is not one', async () => {
    const [calder] = await t.db.query(`SELECT id, is_demo FROM lab WHERE name = 'Calder Analytical'`);
    expect(calder.is_demo).toBe(true); // set by the seed

    expect(await reportText('OP-7K3M-Q9')).toContain(DEMO_MARK);

    await t.db.query('UPDATE lab SET is_demo = false WHERE id = $1', [calder.id]);
    const text = await reportText('OP-4HXT-2B');
    expect(text).toContain('OP-4HXT-2B');
    expect(text).not.toContain('Demonstration report');
  });
});
