import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { renderReportPdf } from './render-report-pdf';
import { demoReportData } from './demo-report-content';
import { createSelfSignedCredential } from '../signing/self-signed-credential';
import { signPdf } from '../signing/sign-pdf';
import { SCREENING_CAUTION } from './report-wording';

// Checks the rendered report with Debian's poppler-utils, the same tools a reader's system uses.
// Rendering and signing take about a second each here, more under load: the default 5 s is too tight.
jest.setTimeout(30_000);
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const p12 = createSelfSignedCredential({ labName: 'Calder Analytical (demo)', passphrase: 'test-passphrase' });

async function signedReport(name: string, overrides = {}): Promise<string> {
  const data = demoReportData(overrides);
  const pdf = await renderReportPdf(data);
  const signed = await signPdf(pdf, p12, 'test-passphrase', {
    reason: `Test report ${data.reportNumber}`,
    signerName: data.lab.name,
    location: 'Calder Bridge',
    contactInfo: 'reports@calder.test',
    signingTime: new Date(data.issuedAt),
  });
  const file = join(dir, `${name}.pdf`);
  writeFileSync(file, signed);
  return file;
}

const pages = (file: string): string[] => execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).split('\f').filter((p) => p.trim());
const flat = (text: string): string => text.replace(/\s+/g, ' ');

describe('a signed test report', () => {
  let file: string;
  beforeAll(async () => {
    file = await signedReport('issued');
  });

  it('carries a signature that pdfsig reports as valid', () => {
    const out = execFileSync('pdfsig', [file], { encoding: 'utf8' });
    expect(out).toContain('Signature is Valid.');
    expect(out).toContain('Total document signed');
    expect(out).toContain('Calder Analytical (demo) report signing');
  });

  it('shows the report number and "page x of y" on every page', () => {
    const all = pages(file);
    expect(all.length).toBeGreaterThanOrEqual(2);
    all.forEach((page, i) => {
      expect(page).toContain('CAL-2026-000042');
      expect(page).toContain(`Page ${i + 1} of ${all.length}`);
    });
  });

  it('states the screening caution, the decision rule with its thresholds, the verdict and a marked end', () => {
    const text = flat(pages(file).join(' '));
    expect(text).toContain(flat(SCREENING_CAUTION));
    expect(text).toContain('Decision rule: T95 (0.0188) and T99 (0.0246)');
    expect(text).toContain('Consistent with the reference library');
    expect(text).toContain('The results in this report relate only to the item tested');
    expect(text).toContain('End of report');
    expect(text).toContain('K7QM-4RTX-9WHP');
    expect(text).toContain('DAS-0000-DEMO');
  });

  it('writes units with Ω from the Greek subset of Inter instead of dropping the glyph', () => {
    expect(pages(file).join(' ')).toContain('Ω·cm');
  });
});

describe('an amended test report', () => {
  it('names the report it replaces and the reason', async () => {
    const file = await signedReport('amended', {
      reportNumber: 'CAL-2026-000042-R1',
      replaces: { reportNumber: 'CAL-2026-000042', reason: 'Claimed lot corrected from the label.' },
    });
    const text = flat(pages(file).join(' '));
    expect(text).toContain('This report replaces report CAL-2026-000042');
    expect(text).toContain('Claimed lot corrected from the label.');
    expect(execFileSync('pdfsig', [file], { encoding: 'utf8' })).toContain('Signature is Valid.');
  });

  it('renders a library too small for a verdict: no thresholds, map or fitted model, and says so', async () => {
    const base = demoReportData();
    const file = await signedReport('no-verdict', {
      results: { ...base.results, verdict: 'no-verdict', t95: null, t99: null, typicality: null, fittedParameters: [], goodnessOfFit: null, qualityFlags: [] },
      plots: { ...base.plots, referenceEnvelope: null, calibrationDistances: [], map: null },
    });
    const text = flat(pages(file).join(' '));
    expect(text).toContain('No verdict');
    expect(text).toContain('T95 = not available');
    expect(text).toContain('No model was fitted.');
    expect(execFileSync('pdfsig', [file], { encoding: 'utf8' })).toContain('Signature is Valid.');
  });

  it('marks invented demo data on every page', async () => {
    const file = await signedReport('demo');
    for (const page of pages(file)) expect(page).toContain('Demonstration report: invented data');
  });

  it('shows a not-consistent verdict in words', async () => {
    const base = demoReportData();
    const file = await signedReport('not-consistent', { results: { ...base.results, verdict: 'not-consistent', nearestDistance: 0.061 } });
    expect(flat(pages(file).join(' '))).toContain('Not consistent with the reference library');
  });
});
