// The whole loop of one suspect sample, in a real browser: ordered (seeded), received at intake,
// measured, analysed, reviewed by a second person, reported, downloaded by the client and verified
// by a visitor. The steps run in order and hand on what the next person needs.
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, url } from './support/browser';
import { pdfPlainText, pdfSignatureReport } from './support/report-pdf-checks';
import { exportsFor } from './support/replicate-exports';
import { describeFindings } from './support/accessibility';
import { accessTokenFor, accessibilitySoFar, openFromMenu, screenshotWhole, signInAt, type Desk } from './support/desk';
import { ARTIFACTS } from './support/stack';

/** A seeded Ridgeline Red (demo) sample of Hollin Ridge Cellars, still awaiting arrival. */
const SAMPLE = 'OP-3VNC-8P';
const CLIENT_ADMIN = 'admin@hollinridge.test';
const INTAKE = 'intake@calder.test';
const ANALYST = 'analyst@calder.test';
const ANALYST_NAME = 'Ana Lyst (demo)';
const REVIEWER = 'reviewer@calder.test';
const LAB_ADMIN = 'admin@calder.test';
const REMARKS = 'Three replicates agree; the spectrum matches the library. Invented demo remark.';

/** The caution the product promises on every report, word for word. */
const CAUTION =
  "An impedance fingerprint is a screening method: it tells whether a sample is consistent with the producer's reference library " +
  "under the stated method. It does not prove origin or identity by itself; a 'not consistent' result should be confirmed by an " +
  'accredited confirmatory method before legal or commercial action. Results relate only to the items tested.';

// The project's testTimeout is a global-only jest option and does not reach a project's tests.
jest.setTimeout(180_000);

let browser: Browser;
const desks: Desk[] = [];
const handOn: { sampleId?: string; analysisId?: string; reportNumber?: string; verificationCode?: string; pdf?: string } = {};

async function deskOf(portal: 'lab' | 'client', email: string): Promise<Desk> {
  const desk = await signInAt(browser, portal, email);
  desks.push(desk);
  return desk;
}

const PARCEL_PHOTO = 'demo-parcel-photo.png';

/** An invented parcel photo, painted by the browser itself so no image file needs to be checked in. */
async function paintParcelPhoto(): Promise<string> {
  const path = join(ARTIFACTS, PARCEL_PHOTO);
  const painter = await browser.newPage({ viewport: { width: 480, height: 360 } });
  await painter.setContent(
    '<body style="margin:0;height:100vh;display:grid;place-items:center;background:#b98d55;font:600 26px sans-serif;color:#2b1d0e">' +
      '<div style="padding:24px 32px;border:6px dashed #2b1d0e;background:#e9d3ac">Invented demo parcel photo</div></body>',
  );
  await painter.screenshot({ path });
  await painter.close();
  return path;
}

/** The charts draw with the theme's colours; the dark scheme must read as well as the light one. */
async function inDarkScheme(page: Page, look: () => Promise<void>): Promise<void> {
  await page.emulateMedia({ colorScheme: 'dark' });
  await look();
  await page.emulateMedia({ colorScheme: 'light' });
}

function needs<K extends keyof typeof handOn>(key: K): NonNullable<(typeof handOn)[K]> {
  const value = handOn[key];
  if (value === undefined) throw new Error(`An earlier step did not produce ${key}; see its failure above.`);
  return value as NonNullable<(typeof handOn)[K]>;
}

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  for (const d of desks) await d.context.close();
  await browser?.close();
});

describe('one suspect sample, from order to verified report', () => {
  it('1. the client admin sees the seeded order with its sample awaiting arrival', async () => {
    const { page } = await deskOf('client', CLIENT_ADMIN);
    await openFromMenu(page, 'Orders');
    const row = page.getByRole('table', { name: 'Orders', exact: true }).getByRole('row').filter({ hasText: SAMPLE });
    await row.waitFor();
    expect(await row.innerText()).toContain('Ridgeline Red (demo)');
    expect(await row.innerText()).toContain('Awaiting arrival');
    await screenshotWhole(page, 'whole-loop-01-client-orders');
  });

  it('2. the intake technician receives, accepts and stores the sample; custody shows each event', async () => {
    const { page } = await deskOf('lab', INTAKE);
    await openFromMenu(page, 'Receive samples');
    const code = page.getByLabel('Sample code');
    // a scanner types the code and Enter
    await code.fill(SAMPLE);
    await code.press('Enter');
    await page.getByLabel('Carrier').fill('Invented Courier Co.');
    await page.getByLabel('Tracking number').fill('DEMO-TRK-3VNC8P');
    await page.getByLabel('Temperature on arrival').fill('14.5');
    await page.getByRole('combobox', { name: 'Container condition' }).click();
    await page.getByRole('option', { name: 'intact' }).click();
    await page.getByLabel('Volume').fill('750');
    expect(await page.getByRole('checkbox', { name: 'Seal intact' }).isChecked()).toBe(true);
    await page.getByLabel('Notes').fill('Invented demo parcel, bottle upright, capsule unbroken.');
    await page.getByLabel('choose photos').setInputFiles(await paintParcelPhoto());
    await page.getByRole('img', { name: `Preview of ${PARCEL_PHOTO}` }).waitFor();
    await screenshotWhole(page, 'whole-loop-02a-intake-arrival-form');
    await page.getByRole('button', { name: 'Record arrival' }).click();
    await page.getByText('1 photo saved with the intake record.').first().waitFor();

    await page.getByLabel('Storage location').fill('Wine cellar rack 3 (demo)');
    await screenshotWhole(page, 'whole-loop-02b-intake-accept');
    await page.getByRole('button', { name: 'Accept and store' }).click();
    await page.getByText(`${SAMPLE} accepted and stored at Wine cellar rack 3 (demo).`).first().waitFor();
    // the bench promise: after a decision the cursor is back in the code field for the next parcel
    await page.waitForFunction((field) => field === document.activeElement, await code.elementHandle());

    await code.fill(SAMPLE);
    await code.press('Enter');
    const timeline = page.getByRole('list', { name: 'Chain of custody, oldest first' });
    await timeline.getByRole('listitem').nth(2).waitFor();
    const events = await timeline.getByRole('listitem').allInnerTexts();
    expect(events.map((e) => /Received|Accepted|Stored/.exec(e)?.[0])).toEqual(['Received', 'Accepted', 'Stored']);
    expect(events.every((e) => e.includes('Ira Intake (demo)'))).toBe(true);
    expect(events[2]).toContain('Wine cellar rack 3 (demo)');
    await page.getByRole('img', { name: `Intake photo ${PARCEL_PHOTO}` }).waitFor();
    await screenshotWhole(page, 'whole-loop-02c-intake-custody');
  });

  it('3. the analyst uploads the replicates (a bad file is named with its line), runs the analysis and submits it', async () => {
    const { page } = await deskOf('lab', ANALYST);
    await openFromMenu(page, 'Work queue');
    await page.getByRole('table', { name: 'Work queue', exact: true }).getByRole('link', { name: SAMPLE }).click();
    await page.waitForURL(/\/lab\/samples\/[0-9a-f-]{36}$/);
    handOn.sampleId = new URL(page.url()).pathname.split('/').pop();
    await page.getByRole('button', { name: `Open photo ${PARCEL_PHOTO}` }).click();
    const viewer = page.getByRole('dialog', { name: PARCEL_PHOTO });
    await viewer.getByText('Taken in by Ira Intake (demo)').waitFor();
    await screenshotWhole(page, 'whole-loop-03-intake-photo');
    await viewer.getByRole('button', { name: 'Close' }).click();
    await viewer.waitFor({ state: 'detached' });

    // a select with no options yet does not open, so wait for the bench list as a person waits for the page
    const bench = page.waitForResponse((r) => r.url().endsWith('/api/lab/bench') && r.ok());
    await page.getByRole('tab', { name: 'Measurements' }).click();
    await bench;
    await page.getByRole('combobox', { name: 'Instrument' }).click();
    await page.getByRole('option', { name: /Bench analyser 1 \(demo\)/ }).click();
    await page.getByRole('combobox', { name: 'Cell' }).click();
    await page.getByRole('option', { name: /Dip cell A \(demo\)/ }).click();
    await page.getByLabel('Sample temperature').fill('22.5');
    await page.getByRole('radio', { name: /From the latest KCl calibration/ }).check();
    const { paths, broken } = exportsFor(SAMPLE);
    await page.getByLabel('choose files').setInputFiles(paths);
    await page.getByRole('button', { name: 'Upload 4 files' }).click();

    const refusal = page.getByRole('alert').filter({ hasText: broken });
    await refusal.waitFor();
    expect(await refusal.innerText()).toMatch(/line 9/);
    const files = page.getByRole('list', { name: 'Files to upload' });
    await files.getByText('Saved as replicate 3.').waitFor();
    expect(await files.getByText('Saved', { exact: true }).count()).toBe(3);

    const replicateTable = page.getByRole('table').filter({ has: page.getByRole('columnheader', { name: 'Kramers–Kronig' }) });
    const replicates = replicateTable.getByRole('row').filter({ has: page.getByRole('cell') });
    await replicates.nth(2).waitFor();
    expect(await replicates.count()).toBe(3);
    expect(await replicates.allInnerTexts()).toEqual(paths.filter((p) => !p.endsWith(broken)).map((p) => expect.stringContaining(p.split('/').pop()!)));
    for (const r of await replicates.allInnerTexts()) expect(r).toMatch(/Pass: [\d.]+ % \(limit/);
    await page.getByRole('heading', { level: 1 }).filter({ hasText: 'Being measured' }).waitFor();
    await page.getByText('Bode plot, replicates overlaid').waitFor();
    await page.getByText('Nyquist plot, replicates overlaid').waitFor();
    await replicates.first().getByRole('button', { name: 'Residuals' }).click();
    await page.getByText('Kramers–Kronig residuals, replicate 1').waitFor();
    await screenshotWhole(page, 'whole-loop-03a-measurements');
    await inDarkScheme(page, () => screenshotWhole(page, 'whole-loop-03a-measurements-dark'));

    await page.getByRole('tab', { name: 'Analysis' }).click();
    await page.getByRole('button', { name: 'Run analysis' }).click();
    const verdict = page.getByRole('status').filter({ hasText: 'Consistent with the reference library' });
    await verdict.waitFor();
    await page.getByText('Sample among the library’s own spread').waitFor();
    await page.getByText('Map of the sample among the reference lots').waitFor();
    await page.getByLabel('Analyst\'s remarks (printed on the report)').fill(REMARKS);
    await screenshotWhole(page, 'whole-loop-03b-analysis');
    await inDarkScheme(page, () => screenshotWhole(page, 'whole-loop-03b-analysis-dark'));
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(`Analysis of ${SAMPLE} submitted for review.`).first().waitFor();
    await page.getByText(/status awaiting review/).waitFor();
    await screenshotWhole(page, 'whole-loop-03c-submitted');
  });

  it('the analyst may not review their own analysis, even when also given the reviewer role', async () => {
    const admin = await deskOf('lab', LAB_ADMIN);
    await openFromMenu(admin.page, 'Staff');
    await admin.page.getByRole('button', { name: `Actions for ${ANALYST_NAME}` }).click();
    await admin.page.getByRole('menuitem', { name: 'Change roles' }).click();
    await admin.page.getByRole('checkbox', { name: /^Reviewer/ }).check();
    await admin.page.getByRole('button', { name: 'Save roles' }).click();
    await admin.page.getByRole('row').filter({ hasText: ANALYST_NAME }).filter({ hasText: 'Reviewer' }).waitFor();

    const { page } = await deskOf('lab', ANALYST);
    await openFromMenu(page, 'Reviews');
    const mine = page.getByRole('table', { name: 'Analyses awaiting review', exact: true }).getByRole('row').filter({ hasText: SAMPLE });
    expect(await mine.innerText()).toContain('someone else must review');
    await mine.getByRole('link', { name: SAMPLE }).click();
    await page.waitForURL(/\/lab\/reviews\/[0-9a-f-]{36}$/);
    handOn.analysisId = new URL(page.url()).pathname.split('/').pop();
    await page.getByText('You ran this analysis, so you cannot review it').waitFor();
    expect(await page.getByRole('button', { name: 'Approve and issue the report' }).isDisabled()).toBe(true);
    await screenshotWhole(page, 'whole-loop-04a-own-review-refused');

    // the screen only disables the button; the API itself must refuse a direct request
    const res = await fetch(url(`/api/lab/analyses/${needs('analysisId')}/approve`), {
      method: 'POST',
      headers: { authorization: `Bearer ${await accessTokenFor(ANALYST)}`, 'content-type': 'application/json' },
      body: JSON.stringify({ comments: 'Approving my own work' }),
    });
    expect(res.status).toBe(403);
    expect(((await res.json()) as { title: string }).title).toBe('Four-eyes rule');
  });

  it('4. the reviewer approves, which issues the signed report with its number', async () => {
    const { page } = await deskOf('lab', REVIEWER);
    await openFromMenu(page, 'Reviews');
    await page.getByRole('table', { name: 'Analyses awaiting review', exact: true }).getByRole('link', { name: SAMPLE }).click();
    await page.getByText(REMARKS).waitFor();
    await page.getByRole('button', { name: 'Approve and issue the report' }).click();
    // the confirmation names the number to come and the signing credential first
    await page.getByRole('dialog').getByRole('button', { name: 'Approve and issue' }).click();
    const issued = page.getByText(/Report [A-Z]{2,4}-\d{4}-\d{6} issued, signed and sent to the client\./);
    await issued.waitFor();
    handOn.reportNumber = /([A-Z]{2,4}-\d{4}-\d{6})/.exec(await issued.innerText())![1];
    expect(handOn.reportNumber).toMatch(/^CAL-\d{4}-\d{6}$/);
    await page.getByText('Status: approved, report issued.').waitFor();
    await screenshotWhole(page, 'whole-loop-04b-report-issued');
  });

  it('5. the client admin downloads the report PDF: signature valid, number and caution printed', async () => {
    const number = needs('reportNumber');
    const { page } = await deskOf('client', CLIENT_ADMIN);
    await openFromMenu(page, 'Reports');
    const row = page.getByRole('table', { name: 'Reports', exact: true }).getByRole('row').filter({ hasText: number });
    expect(await row.innerText()).toContain(SAMPLE);
    expect(await row.innerText()).toContain('Consistent');
    await screenshotWhole(page, 'whole-loop-05-client-reports');
    const [download] = await Promise.all([page.waitForEvent('download'), row.getByRole('button', { name: 'PDF' }).click()]);
    expect(download.suggestedFilename()).toBe(`${number}.pdf`);
    const pdf = join(ARTIFACTS, `${number}.pdf`);
    await download.saveAs(pdf);
    handOn.pdf = pdf;

    expect(pdfSignatureReport(pdf)).toContain('Signature is Valid.');
    const text = pdfPlainText(pdf);
    expect(text).toContain(number);
    expect(text).toContain(SAMPLE);
    expect(text).toContain(CAUTION);
    const code = /Verification code ([2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4})/.exec(text);
    expect(code).not.toBeNull();
    handOn.verificationCode = code![1];
  });

  it('6. a visitor verifies the report by number and code, and by uploading the PDF; an altered copy fails', async () => {
    const [number, code, pdf] = [needs('reportNumber'), needs('verificationCode'), needs('pdf')];
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    desks.push({ context, page: await context.newPage() });
    const page = desks[desks.length - 1].page;
    page.setDefaultTimeout(60_000);
    await page.goto(url('/verify'));
    await page.getByLabel('Report number').fill(number);
    await page.getByLabel('Verification code').fill(code);
    await page.getByRole('button', { name: 'Check' }).click();
    const outcome = page.getByRole('status').filter({ has: page.getByRole('heading', { name: 'Valid report' }) });
    await outcome.waitFor();
    expect(await outcome.innerText()).toContain(SAMPLE);
    expect(await outcome.innerText()).toContain('Calder Analytical');
    await screenshotWhole(page, 'whole-loop-06a-verify-by-code');

    await page.getByLabel('choose the file').setInputFiles(pdf);
    await page.getByText('The uploaded file is byte-identical to the PDF the lab issued').waitFor();
    await screenshotWhole(page, 'whole-loop-06b-verify-identical-file');

    const altered = join(ARTIFACTS, `${number}-altered.pdf`);
    copyFileSync(pdf, altered);
    const bytes = readFileSync(altered);
    // one byte in the middle of the file, as a careless or deliberate edit would change it
    const middle = Math.floor(bytes.length / 2);
    bytes[middle] = bytes[middle] ^ 0x01;
    writeFileSync(altered, bytes);
    await page.getByLabel('choose the file').setInputFiles(altered);
    await page.getByText('The uploaded file differs from every PDF the lab issued').waitFor();
    expect(await page.getByText('byte-identical').count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Valid report' }).count()).toBe(0);
    await page.getByRole('heading', { name: 'This copy is not the PDF the lab issued' }).waitFor();
    await screenshotWhole(page, 'whole-loop-06c-verify-altered-file');
  });

  it('7. the reviewer amends the report, then revokes the amendment; a visitor sees the first superseded and the second revoked', async () => {
    const [number, code] = [needs('reportNumber'), needs('verificationCode')];
    const amended = `${number}-R1`;
    const { page } = await deskOf('lab', REVIEWER);
    await openFromMenu(page, 'Reports');
    const reports = page.getByRole('table', { name: 'Reports', exact: true });
    await reports.getByRole('button', { name: `More for ${number}` }).click();
    await page.getByRole('menuitem', { name: 'Amend…' }).click();
    const amend = page.getByRole('dialog', { name: `Amend report ${number}?` });
    await amend.getByLabel('Remarks (the current ones, to correct)').fill(`${REMARKS} Claimed lot checked against the label.`);
    await amend.getByLabel('Reason (printed and shown on verification)').fill('Remarks completed (invented demo amendment).');
    await screenshotWhole(page, 'whole-loop-07a-amend-dialog');
    await amend.getByRole('button', { name: 'Issue amendment' }).click();
    await page.getByText(`Amendment ${amended} issued; ${number} now reads as superseded.`).first().waitFor();
    await reports.getByRole('row').filter({ hasText: `superseded by ${amended}` }).waitFor();

    // the amendment's own verification code is printed on its PDF
    const [download] = await Promise.all([page.waitForEvent('download'), reports.getByRole('button', { name: `Download ${amended}` }).click()]);
    const amendedPdf = join(ARTIFACTS, `${amended}.pdf`);
    await download.saveAs(amendedPdf);
    expect(pdfSignatureReport(amendedPdf)).toContain('Signature is Valid.');
    const amendedText = pdfPlainText(amendedPdf);
    expect(amendedText).toContain(`This report replaces report ${number}`);
    expect(amendedText).toContain('Remarks completed (invented demo amendment).');
    const amendedCode = /Verification code ([2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4})/.exec(amendedText)![1];
    expect(amendedCode).not.toBe(code);

    await reports.getByRole('button', { name: `More for ${amended}` }).click();
    await page.getByRole('menuitem', { name: 'Revoke…' }).click();
    const revoke = page.getByRole('dialog', { name: `Revoke report ${amended}?` });
    await revoke.getByLabel('Reason (printed and shown on verification)').fill('Sent to the wrong client contact (invented demo revocation).');
    await revoke.getByRole('button', { name: 'Revoke report' }).click();
    await page.getByText(`${amended} revoked.`).first().waitFor();
    await reports.getByRole('row').filter({ hasText: amended }).filter({ hasText: 'Revoked' }).waitFor();
    await screenshotWhole(page, 'whole-loop-07b-lab-reports-amended-and-revoked');

    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const visitor = await context.newPage();
    desks.push({ context, page: visitor });
    visitor.setDefaultTimeout(60_000);
    const check = async (reportNumber: string, verificationCode: string) => {
      await visitor.goto(url('/verify'));
      await visitor.getByLabel('Report number').fill(reportNumber);
      await visitor.getByLabel('Verification code').fill(verificationCode);
      await visitor.getByRole('button', { name: 'Check' }).click();
    };
    await check(number, code);
    await visitor.getByRole('heading', { name: 'Superseded: a newer revision replaces this report' }).waitFor();
    expect(await visitor.getByText(`Replaced by ${amended}`).count()).toBe(1);
    await visitor.getByText(`replaced by report ${amended}, which the laboratory has since revoked; no revision of this report is in force`).waitFor();
    await screenshotWhole(visitor, 'whole-loop-07c-verify-superseded');
    await check(amended, amendedCode);
    await visitor.getByRole('heading', { name: 'Revoked by the issuing lab' }).waitFor();
    await visitor.getByText('Sent to the wrong client contact (invented demo revocation).').waitFor();
    await screenshotWhole(visitor, 'whole-loop-07d-verify-revoked');
  });

  it('8. every screen photographed on the way passes the automated WCAG 2.1 A and AA checks (axe-core)', () => {
    const { screens, findings } = accessibilitySoFar();
    expect(screens).toHaveLength(20);
    expect(describeFindings(findings)).toBe('');
  });
});
