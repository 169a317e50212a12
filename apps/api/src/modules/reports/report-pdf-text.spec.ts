import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { analyseDemoSample, approveAndIssue, useTestApp } from '../../testing';
import { SCREENING_CAUTION } from './pdf/report-wording';

// Seeding, analysing and issuing the first report (which creates the signing credential) take seconds.
jest.setTimeout(120_000);

const t = useTestApp();
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-report-text-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/**
 * An issued report read back as a reader's tools read it: Debian's pdftotext (poppler). Every
 * figure below comes from the signed PDF the API stored, not from the data it was drawn from.
 */
describe('an issued report, read with pdftotext', () => {
  let text: string;
  let analysis: { result: { fit: { parameters: { name: string; value: number; standardError: number | null }[] } | null } };

  beforeAll(async () => {
    await t.db.transaction((m) => seedLabDemo(m));
    const id = await analyseDemoSample(t, 'OP-7K3M-Q9');
    const analyst = await t.authFor('analyst');
    analysis = (await request(t.app).get(`/api/lab/analyses/${id}`).set(analyst)).body;
    expect((await request(t.app).post(`/api/lab/analyses/${id}/submit`).set(analyst)).status).toBe(200);
    const issued = await approveAndIssue(t, id);
    const [report] = await t.db.query('SELECT number, pdf FROM test_report WHERE id = $1', [issued.id]);
    const file = join(dir, `${report.number}.pdf`);
    writeFileSync(file, report.pdf);
    // REPORT_PDF_OUT=/tmp/x.pdf keeps a copy to render with pdftoppm and look at
    if (process.env.REPORT_PDF_OUT) writeFileSync(process.env.REPORT_PDF_OUT, report.pdf);
    text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  });

  it('states the measurement temperature, its referral and the method with its version', () => {
    // the demo files of OP-7K3M-Q9 state 22.5 °C (docker-free-scripts/seed/lab-demo-catalog.ts)
    expect(text).toContain('Measurement temperature 22.5 °C for all 3 replicates (stated in the export)');
    expect(text).toMatch(/referred to 20\.0 °C with a linear coefficient α of 2 %\/°C/);
    expect(text).toMatch(/Method [^,]+, version \d+: Impedance fingerprint screening/);
  });

  it('states the library version with its lot count and how the thresholds were estimated', () => {
    expect(text).toMatch(/Reference library Ridgeline Red \(demo\), version \d+ \(\d+ lots, published/);
    expect(text).toMatch(/Thresholds estimated by [a-z].+ from the leave-one-out distances of n = \d+ reference lots\./);
  });

  it('names the nearest lot with the producer’s lot code and says whether it is the claimed lot', () => {
    expect(text).toMatch(/Nearest reference lot RID-L\d{4}(, the producer's lot L24-\d+| \(the producer's lot code\))/);
    expect(text).toMatch(/Claimed lot The nearest lot (is the lot claimed for the item \(L24-118\)|is not the lot claimed for the item: the item claims L24-118)/);
  });

  it('writes R∞ and powers of ten as real superscripts, values to the last place of their standard error', () => {
    // the demo's method fits the Cole–Cole model, whose first parameter is R∞ (libs/spectral-engine builtin-models)
    expect(text).toContain('R∞');
    expect(text).not.toContain('R_inf');
    expect(text).not.toMatch(/10\^-?\d/);
    expect(text).toMatch(/× 10⁻[¹²³⁴⁵⁶⁷⁸⁹]/);
    expect(text).toMatch(/weighted χ², [a-z]+ weighting\): /);
    // each fitted value and its SE share their last decimal place (the 354/949 rule, libs/contracts/src/format)
    const values = [...text.matchAll(/(\d+\.?\d*) ± (\d+\.?\d*)/g)];
    expect(values.length).toBeGreaterThanOrEqual(analysis.result.fit!.parameters.filter((p) => p.standardError !== null).length);
    for (const [, v, se] of values) expect((v.split('.')[1] ?? '').length).toBe((se.split('.')[1] ?? '').length);
  });

  it('keeps the screening caution', () => {
    expect(text).toContain(SCREENING_CAUTION.replace(/\s+/g, ' '));
  });
});
