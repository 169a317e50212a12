// Lab settings and client notifications, as the people who use them: the lab admin edits the lab's
// profile with a logo and uploads the lab's signing certificate; the reviewer's approval names the
// report number to come and the certificate that will sign; the client sees the notice arrive.
// Each new screen is photographed and checked with axe-core in the light and the dark scheme.
import { execFileSync } from 'node:child_process';
import { generateKeyPairSync, randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import forge from 'node-forge';
import PDFDocument from 'pdfkit';
import type { Browser, Page } from 'playwright-core';
import { accessibilityFindings, describeFindings, type ScreenFinding } from './support/accessibility';
import { launchBrowser, screenshot, url } from './support/browser';
import { openFromMenu, signInAt } from './support/desk';
import { apiAs as api, measureAndAnalyse } from './support/lab-api';
import { ARTIFACTS } from './support/stack';

const SAMPLE = 'OP-4HXT-2B';
const CLIENT_ADMIN = 'admin@hollinridge.test';
const CERT_NAME = 'Calder Analytical report signing (browser test)';
const PASSPHRASE = 'browser test passphrase';
const WORK = join(ARTIFACTS, 'lab-settings');

let browser: Browser;
const findings: ScreenFinding[] = [];
const handOn: { reportNumber?: string; reportId?: string } = {};

beforeAll(async () => {
  mkdirSync(WORK, { recursive: true });
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** axe in both schemes, and a photograph of each, for the screen as it is now. */
async function look(page: Page, name: string): Promise<void> {
  await page.waitForLoadState('networkidle');
  await page.waitForFunction(() => !document.querySelector('mat-progress-bar[mode="indeterminate"]'));
  // the portals scroll inside the shell: grow the window to the tallest scrolling area for the picture
  const size = page.viewportSize() ?? { width: 1280, height: 900 };
  const tallest = await page.evaluate(() => Math.max(...Array.from(document.querySelectorAll('*'), (e) => (e.scrollHeight > e.clientHeight + 1 ? e.scrollHeight : 0)), 0));
  await page.setViewportSize({ width: size.width, height: Math.min(4000, Math.max(size.height, tallest + 80)) });
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    findings.push(...(await accessibilityFindings(page, `${name} (${scheme})`)));
    await screenshot(page, `lab-settings-${name}-${scheme}`);
  }
  await page.emulateMedia({ colorScheme: 'light' });
  await page.setViewportSize(size);
}

/** A wide logo as a PNG: drawn with pdfkit, rasterised with pdftoppm. */
async function logoPng(): Promise<string> {
  const doc = new PDFDocument({ size: [300, 100], margin: 0 });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((r) => doc.on('end', () => r(Buffer.concat(chunks))));
  doc.on('data', (c: Buffer) => chunks.push(c));
  doc.rect(0, 0, 300, 100).fill('#ffffff');
  doc.circle(50, 50, 34).fill('#00695c');
  doc.circle(50, 50, 16).fill('#ffffff');
  doc.fillColor('#00695c').fontSize(34).text('CALDER', 100, 18);
  doc.fillColor('#7a736b').fontSize(14).text('analytical (demo)', 102, 58);
  doc.end();
  writeFileSync(join(WORK, 'logo.pdf'), await done);
  execFileSync('pdftoppm', ['-png', '-r', '144', '-singlefile', join(WORK, 'logo.pdf'), join(WORK, 'logo')]);
  return join(WORK, 'logo.png');
}

/** The lab's own certificate, made here with node-forge (key from Node): what a lab admin would upload. */
function p12File(): string {
  const { privateKey, publicKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
  const key = forge.pki.privateKeyFromPem(privateKey.export({ type: 'pkcs1', format: 'pem' }).toString());
  const cert = forge.pki.createCertificate();
  cert.publicKey = forge.pki.publicKeyFromPem(publicKey.export({ type: 'spki', format: 'pem' }).toString());
  cert.serialNumber = `01${randomBytes(8).toString('hex')}`;
  cert.validity.notBefore = new Date(Date.now() - 86_400_000);
  cert.validity.notAfter = new Date(Date.now() + 2 * 365 * 86_400_000);
  const subject = [{ name: 'commonName', value: CERT_NAME }, { name: 'organizationName', value: 'Calder Analytical' }];
  const issuer = [{ name: 'commonName', value: 'Demo Issuing Authority (invented)' }];
  cert.setSubject(subject);
  cert.setIssuer(issuer);
  cert.sign(key, forge.md.sha256.create());
  const der = forge.asn1.toDer(forge.pkcs12.toPkcs12Asn1(key, [cert], PASSPHRASE, { algorithm: '3des' })).getBytes();
  const file = join(WORK, 'calder-signing.p12');
  writeFileSync(file, Buffer.from(der, 'binary'));
  return file;
}


/** The analyst measures, analyses and submits the sample through the API, so the reviewer has it waiting. */
async function submittedAnalysis(): Promise<string> {
  const analyst = 'analyst@calder.test';
  const json = { 'content-type': 'application/json' };
  const { analysisId: id } = await measureAndAnalyse(SAMPLE);
  await api(analyst, `/api/lab/analyses/${id}/remarks`, { method: 'PUT', headers: json, body: JSON.stringify({ remarks: 'Three replicates, none excluded.' }) });
  const submitted = await api(analyst, `/api/lab/analyses/${id}/submit`, { method: 'POST', headers: json, body: '{}' });
  expect(submitted.status).toBe(200);
  return id;
}

describe('lab settings, the approval confirmation and client notifications', () => {
  it('1. the lab admin edits the profile and uploads a logo', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'admin@calder.test');
    await openFromMenu(page, 'Lab profile');
    await page.getByRole('heading', { name: 'Lab profile', level: 1 }).waitFor();
    await page.getByLabel('Contact phone').fill('+44 1632 960999');
    await page.getByLabel('Shipping instructions').fill('Ship Monday to Wednesday, chilled, each bottle in its own sealed bag (browser test).');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText('The lab profile was saved.').waitFor();

    // a text file named .png is refused by its content, and the message says so
    const fake = join(WORK, 'not-a-logo.png');
    writeFileSync(fake, 'just text');
    await page.locator('input[type=file]').setInputFiles(fake);
    await page.getByText('is not a PNG or JPEG image').waitFor();

    await page.locator('input[type=file]').setInputFiles(await logoPng());
    await page.getByText('Logo saved').waitFor();
    await page.getByRole('img', { name: 'Current logo of Calder Analytical' }).waitFor();
    await look(page, 'profile');
    await context.close();
  });

  it('2. the lab admin uploads the lab’s PKCS#12; a wrong passphrase is refused and nothing changes', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'admin@calder.test');
    await openFromMenu(page, 'Signing certificate');
    await page.getByRole('heading', { name: 'Signing certificate', level: 1 }).waitFor();
    // Other journeys may have issued reports first, so the lab may already sign with the development credential.
    await page.getByLabel('Passphrase').waitFor();
    const file = p12File();
    await page.locator('input[type=file]').setInputFiles(file);
    await page.getByLabel('Passphrase').fill('not the passphrase');
    await page.getByRole('button', { name: 'Check and use this certificate' }).click();
    await page.getByText(/passphrase is wrong.*The certificate in use has not changed\./).waitFor();
    await look(page, 'certificate-refused');

    await page.getByLabel('Passphrase').fill(PASSPHRASE);
    await page.getByRole('button', { name: 'Check and use this certificate' }).click();
    await page.getByText('Certificate checked and in use').waitFor();
    await page.getByText(`CN=${CERT_NAME}, O=Calder Analytical`).waitFor();
    await page.getByText(/^([0-9A-F]{2}:){31}[0-9A-F]{2}$/).waitFor();
    expect(await page.getByText('Development self-signed credential').count()).toBe(0);
    await look(page, 'certificate');
    await context.close();
  });

  it('3. the reviewer’s approval names the number to come and the certificate; the report takes that number', async () => {
    const analysisId = await submittedAnalysis();
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await page.goto(url(`/lab/reviews/${analysisId}`));
    await page.getByText('Three replicates, none excluded.').waitFor();
    await page.getByRole('button', { name: 'Approve and issue the report' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByText(`CN=${CERT_NAME}, O=Calder Analytical`).waitFor();
    const number = (await dialog.locator('.number').innerText()).trim();
    expect(number).toMatch(/^CAL-\d{4}-\d{6}$/);
    await look(page, 'approval-confirmation');

    // cancelling takes nothing: the same number is offered again
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await page.getByRole('button', { name: 'Approve and issue the report' }).click();
    await expect(page.getByRole('dialog').locator('.number').innerText()).resolves.toBe(number);
    await page.getByRole('dialog').getByRole('button', { name: 'Approve and issue' }).click();
    await page.getByText(`Report ${number} issued, signed and sent to the client.`).waitFor();
    handOn.reportNumber = number;
    const reports = (await (await api('reviewer@calder.test', `/api/lab/reports?q=${number}`)).json()) as { items: { id: string }[] };
    handOn.reportId = reports.items[0].id;
    await context.close();
  });

  it('4. the report PDF carries the logo in its header and the uploaded certificate’s signature', async () => {
    const res = await api('reviewer@calder.test', `/api/lab/reports/${handOn.reportId}/pdf`);
    expect(res.status).toBe(200);
    const pdf = join(WORK, `${handOn.reportNumber}.pdf`);
    writeFileSync(pdf, Buffer.from(await res.arrayBuffer()));
    const sig = execFileSync('pdfsig', [pdf], { encoding: 'utf8' });
    expect(sig).toContain(`Signer Certificate Common Name: ${CERT_NAME}`);
    const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [pdf], { encoding: 'utf8' }))![1]);
    const logoImages = execFileSync('pdfimages', ['-list', pdf], { encoding: 'utf8' }).split('\n').filter((l) => /\s600\s+200\s/.test(l));
    expect(logoImages).toHaveLength(pages);
    // the first page rendered for a person to look at (test/artifacts/browser/lab-settings/)
    execFileSync('pdftoppm', ['-png', '-r', '110', '-f', '1', '-l', '1', pdf, join(WORK, 'report-page')]);
    expect(readFileSync(join(WORK, 'report-page-1.png')).length).toBeGreaterThan(10_000);
  });

  it('5. the client admin sees the unread count on the bell and the notice in the list, and marks it read', async () => {
    const { context, page } = await signInAt(browser, 'client', CLIENT_ADMIN);
    const bell = page.getByRole('link', { name: /^Notifications, \d+ unread$/ });
    await bell.waitFor();
    const unread = Number(/(\d+) unread/.exec((await bell.getAttribute('aria-label'))!)![1]);
    expect(unread).toBeGreaterThanOrEqual(1);
    await bell.click();
    await page.getByRole('heading', { name: 'Notifications', level: 1 }).waitFor();
    const item = page.getByRole('listitem').filter({ hasText: `Test report ${handOn.reportNumber} is ready` });
    await item.waitFor();
    expect(await item.innerText()).toContain('Unread');
    await look(page, 'client-notifications');

    await page.getByRole('button', { name: 'Mark all read' }).click();
    await page.getByRole('link', { name: 'Notifications, none unread' }).waitFor();
    // the bell counts at once; the list shows the notice read once its reload has come back
    await item.filter({ hasNotText: 'Unread' }).waitFor();
    expect(await item.innerText()).not.toContain('Unread');
    await item.getByRole('link', { name: 'Open reports' }).click();
    await page.waitForURL(/\/reports$/);
    await context.close();
  });

  it('has no automated accessibility findings on the screens above, light or dark', () => {
    expect(describeFindings(findings)).toBe('');
  });
});
