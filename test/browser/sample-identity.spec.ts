// Sample identity in a real browser: the analyst uploads a file that names another sample, reads the
// refusal naming that sample's code, and keeps the file with a reason; the measurement screen and
// the reviewer's screen show, in plain view, what each file says about itself.
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { describeFindings } from './support/accessibility';
import { launchBrowser } from './support/browser';
import { accessibilitySoFar, openFromMenu, screenshotWhole, signInAt, type Desk } from './support/desk';
import { ROOT } from './support/stack';

/** A seeded, accepted Sunvale Cloudy Apple (demo) sample; its own exports read "consistent". */
const SAMPLE = 'OP-6TBS-3H';
/** The seeded whole milk sample, whose export is the "wrong" file here. */
const OTHER = 'OP-8MJA-4T';
const DEMO_FILES = join(ROOT, 'docker-free-scripts', 'seed', 'demo-files');
const APPLE = [`${SAMPLE}_cloudy-apple_rep1.csv`, `${SAMPLE}_cloudy-apple_rep2.csv`];
const MILK = `${OTHER}_whole-milk_rep1.csv`;
const REASON = 'Invented demo reason: the cup was relabelled at the bench';

jest.setTimeout(180_000);

let browser: Browser;
const desks: Desk[] = [];

async function deskOf(email: string): Promise<Desk> {
  const desk = await signInAt(browser, 'lab', email);
  desks.push(desk);
  return desk;
}

async function inDarkScheme(page: Page, look: () => Promise<void>): Promise<void> {
  await page.emulateMedia({ colorScheme: 'dark' });
  await look();
  await page.emulateMedia({ colorScheme: 'light' });
}

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  for (const d of desks) await d.context.close();
  await browser?.close();
});

describe('sample identity at upload', () => {
  it('the analyst is told a file names another sample, keeps it with a reason, and sees what each file says', async () => {
    const { page } = await deskOf('analyst@calder.test');
    await openFromMenu(page, 'Work queue');
    await page.getByRole('table', { name: 'Work queue', exact: true }).getByRole('link', { name: SAMPLE }).click();
    await page.waitForURL(/\/lab\/samples\/[0-9a-f-]{36}$/);
    const bench = page.waitForResponse((r) => r.url().endsWith('/api/lab/bench') && r.ok());
    await page.getByRole('tab', { name: 'Measurements' }).click();
    await bench;
    await page.getByRole('combobox', { name: 'Instrument' }).click();
    await page.getByRole('option', { name: /Bench analyser 1 \(demo\)/ }).click();
    await page.getByRole('combobox', { name: 'Cell' }).click();
    await page.getByRole('option', { name: /Dip cell A \(demo\)/ }).click();
    await page.getByRole('radio', { name: /From the latest KCl calibration/ }).check();

    await page.getByLabel('choose files').setInputFiles([...APPLE, MILK].map((f) => join(DEMO_FILES, f)));
    // no typed temperature: the files state theirs, and the form says so instead of assuming 20 °C
    await page.getByText('From the files: 20.5, 19 °C. Leave empty to use them.').waitFor();
    expect(await page.getByLabel('Sample temperature').inputValue()).toBe('');
    const files = page.getByRole('list', { name: 'Files to upload' });
    await files.getByText(`Reads: names ${OTHER} · 19 °C (line 3)`, { exact: false }).waitFor();
    await page.getByRole('button', { name: 'Upload 3 files' }).click();

    const refusal = page.getByRole('alert').filter({ hasText: MILK });
    await refusal.waitFor();
    expect(await refusal.innerText()).toContain(`names sample ${OTHER} in line 3`);
    await files.getByText('Saved as replicate 2.').waitFor();
    await files.getByText('Needs your confirmation').waitFor();
    await screenshotWhole(page, 'sample-identity-01-refused');

    await page.getByLabel('Why this file belongs to this sample').fill(REASON);
    await page.getByRole('button', { name: 'Keep this file' }).click();
    await files.getByText('Saved as replicate 3.').waitFor();

    const sources = page.getByRole('table', { name: 'What each file says about itself' });
    const rows = sources.getByRole('row').filter({ has: page.getByRole('cell') });
    await rows.nth(2).waitFor();
    const texts = await rows.allInnerTexts();
    expect(texts[0]).toContain(APPLE[0]);
    expect(texts[0]).toContain(`${SAMPLE} (file name, line 3)`);
    expect(texts[0]).toContain('Matches this sample');
    expect(texts[0]).toContain('20.5 °C from the file (line 3)');
    expect(texts[0]).toContain('Bench analyser 1 (demo) (Invented IA-200) (line 2)');
    expect(texts[2]).toContain(MILK);
    expect(texts[2]).toContain(`Names ${OTHER}; kept by the analyst: ${REASON}`);
    expect(texts[2]).toContain('19 °C from the file (line 3)');
    await screenshotWhole(page, 'sample-identity-02-measurements');
    await inDarkScheme(page, () => screenshotWhole(page, 'sample-identity-02-measurements-dark'));

    await page.getByRole('tab', { name: 'Analysis' }).click();
    await page.getByRole('button', { name: 'Run analysis' }).click();
    await page.getByText(/^Temperature\. Measured at replicate 1 20\.5 °C \(stated in the file\)/).waitFor();
    await page.getByText('referred to 20 °C with a linear coefficient of 2 %/°C', { exact: false }).first().waitFor();
    await screenshotWhole(page, 'sample-identity-03-analysis');
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(`Analysis of ${SAMPLE} submitted for review.`).first().waitFor();
  });

  it('the reviewer sees each file and what was read from it without opening anything', async () => {
    const { page } = await deskOf('reviewer@calder.test');
    await openFromMenu(page, 'Reviews');
    await page.getByRole('table', { name: 'Analyses awaiting review', exact: true }).getByRole('link', { name: SAMPLE }).click();
    await page.waitForURL(/\/lab\/reviews\/[0-9a-f-]{36}$/);
    const sources = page.getByRole('table', { name: 'Files behind this analysis and what each says about itself' });
    const kept = sources.getByRole('row').filter({ hasText: MILK });
    await kept.waitFor();
    expect(await kept.isVisible()).toBe(true);
    expect(await kept.innerText()).toContain(`Names ${OTHER}; kept by the analyst: ${REASON}`);
    expect(await sources.getByRole('row').filter({ hasText: 'Matches this sample' }).count()).toBe(2);
    await screenshotWhole(page, 'sample-identity-04-review');
    await inDarkScheme(page, () => screenshotWhole(page, 'sample-identity-04-review-dark'));
  });

  it('breaks no automated accessibility rule on the screens above, light or dark', () => {
    const { screens, findings } = accessibilitySoFar();
    expect(screens).toHaveLength(6);
    expect(describeFindings(findings)).toBe('');
  });
});
