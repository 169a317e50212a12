import { P12Signer } from '@signpdf/signer-p12';
import signpdf from '@signpdf/signpdf';
import { plainAddPlaceholder } from '@signpdf/placeholder-plain';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { demoReportData } from './demo-report-content';
import { forgetParsedFonts } from './inter-fonts';
import { renderReportPdf } from './render-report-pdf';
import { createSelfSignedCredential } from '../signing/self-signed-credential';
import { signPdf, type SignatureFields } from '../signing/sign-pdf';

// A worker thread keeps parsed fonts, word layouts and the opened signing credential from one
// report to the next. What it keeps must never change what a report looks like or who signed it.
jest.setTimeout(60_000);
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-kept-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const first = () => demoReportData();
const other = () =>
  demoReportData({
    reportNumber: 'CAL-2026-000043',
    issuedAt: '2026-11-27T08:30:00Z',
    remarks: 'Zweite Prüfung: Château d’Île, Ærø Øl — résumé of the façade’s naïve coöperation; Ω τ χ² R∞ 10⁻⁶.',
  });

describe('what a worker thread keeps between reports', () => {
  it('renders a report to the same bytes with fonts and layouts just parsed as after rendering other reports', async () => {
    forgetParsedFonts();
    const cold = await renderReportPdf(first());
    await renderReportPdf(other());
    await renderReportPdf(other());
    const warm = await renderReportPdf(first());
    expect(warm.equals(cold)).toBe(true);
    // and the other report differs, so the comparison is not between two copies of one cached file
    expect((await renderReportPdf(other())).equals(cold)).toBe(false);
  });

  const fields = (data: ReturnType<typeof first>): SignatureFields => ({ reason: `Test report ${data.reportNumber}`, signerName: data.lab.name, location: 'Calder Bridge', contactInfo: 'reports@calder.test', signingTime: new Date(data.issuedAt) });

  it('signs with the same bytes as @signpdf/signer-p12, and a second credential signs as itself', async () => {
    const data = first();
    const pdf = await renderReportPdf(data);
    const calder = createSelfSignedCredential({ labName: 'Calder Analytical (demo)', passphrase: 'calder-pass' });
    const marlow = createSelfSignedCredential({ labName: 'Marlow Test House (demo)', passphrase: 'marlow-pass' });
    const prepared = plainAddPlaceholder({ pdfBuffer: pdf, reason: fields(data).reason, name: fields(data).signerName, location: fields(data).location, contactInfo: fields(data).contactInfo, signingTime: fields(data).signingTime, signatureLength: 8192, appName: 'Ohmprint' });
    const reference = await signpdf.sign(prepared, new P12Signer(calder, { passphrase: 'calder-pass' }), fields(data).signingTime);

    expect((await signPdf(pdf, calder, 'calder-pass', fields(data))).equals(reference)).toBe(true);
    // the credential is kept open now; signing again gives the same bytes
    expect((await signPdf(pdf, calder, 'calder-pass', fields(data))).equals(reference)).toBe(true);

    const byMarlow = await signPdf(pdf, marlow, 'marlow-pass', fields(data));
    const file = join(dir, 'marlow.pdf');
    writeFileSync(file, byMarlow);
    // pdfsig (poppler) exits 1 on an unknown issuer, which every self-signed credential has
    const out = (() => {
      try {
        return execFileSync('pdfsig', [file], { encoding: 'utf8' });
      } catch (err) {
        return String((err as { stdout?: string }).stdout);
      }
    })();
    expect(out).toContain('Signature is Valid.');
    expect(out).toContain('Marlow Test House (demo) report signing');
  });

  it('refuses a wrong passphrase even after the credential was opened with the right one', async () => {
    const data = first();
    const pdf = await renderReportPdf(data);
    const p12 = createSelfSignedCredential({ labName: 'Calder Analytical (demo)', passphrase: 'right' });
    await signPdf(pdf, p12, 'right', fields(data));
    await expect(signPdf(pdf, p12, 'wrong', fields(data))).rejects.toThrow();
  });
});
