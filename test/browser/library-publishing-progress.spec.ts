// A reviewer publishes a library version of a few thousand lots: while the worker calibrates, the
// version screen counts the lots compared so far with a filling bar, and the count moves; then the
// version reads published. The worker is paused (SIGSTOP) for a moment only to photograph the
// count; the calibration itself is the real job. Checked by axe, light and dark.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { Client } from 'pg';
import { demoRandom, seedFrom } from '../../docker-free-scripts/seed/lab-demo-spectra';
import { decodeLotSpectrum, encodeLotSpectrum } from '../../apps/api/src/modules/libraries/lot-spectrum-bytes';
import { accessibilityFindings, describeFindings, settleAnimations, type ScreenFinding } from './support/accessibility';
import { launchBrowser, url } from './support/browser';
import { accessibilitySoFar, screenshotWhole, signInAt } from './support/desk';
import { measuredLotsDraft } from './support/measured-lots-draft';
import { ROOT, stackEnv } from './support/stack';

jest.setTimeout(300_000);

const PRODUCT = 'Brackwell Perry (browser test)';
const MEASURED = 6;
const EXTRA = 6000;
let browser: Browser;
let db: Client;
let versionId: string;
const findings: ScreenFinding[] = [];

const workerPid = () => Number(readFileSync(join(ROOT, '.data', 'run', 'worker-browser-test.pid'), 'utf8'));

/** A draft of a few measured lots, then thousands more: each a measured lot with a little invented scatter. */
async function draftWithThousandsOfLots(): Promise<string> {
  const { draftId: id } = await measuredLotsDraft(db, { product: PRODUCT, lots: MEASURED, codePrefix: 'BP', lotPrefix: 'BP', seed: 'browser-perry', methodName: 'Perry screening' });

  const { rows: [{ grid_hz }] } = await db.query(`SELECT grid_hz FROM library_version WHERE id = $1`, [id]);
  const grid = Float64Array.from(grid_hz as number[]);
  const { rows: measured } = await db.query<{ id: string; spectrum: Buffer }>(`SELECT id, spectrum FROM reference_lot WHERE library_version_id = $1`, [id]);
  const { rows: cols } = await db.query<{ column_name: string }>(`SELECT column_name FROM information_schema.columns WHERE table_name = 'reference_lot' AND column_name NOT IN ('id', 'lot_code', 'spectrum', 'created_at')`);
  const columns = cols.map((c) => c.column_name);
  const rng = demoRandom(seedFrom('browser-perry:scatter'));
  for (let start = 0; start < EXTRA; start += 1000) {
    const codes: string[] = [];
    const spectra: Buffer[] = [];
    const sources: string[] = [];
    for (let i = start; i < Math.min(EXTRA, start + 1000); i++) {
      const source = measured[i % measured.length];
      const s = decodeLotSpectrum(source.spectrum, grid);
      spectra.push(encodeLotSpectrum({ re: s.re.map((v) => v * (1 + 0.03 * (rng.uniform() - 0.5))), im: s.im.map((v) => v * (1 + 0.03 * (rng.uniform() - 0.5))) }));
      codes.push(`BPX-${String(i).padStart(5, '0')}`);
      sources.push(source.id);
    }
    await db.query(
      `INSERT INTO reference_lot (lot_code, spectrum, ${columns.join(', ')})
       SELECT n.code, n.spectrum, ${columns.map((c) => `r.${c}`).join(', ')}
       FROM unnest($1::text[], $2::bytea[], $3::uuid[]) AS n(code, spectrum, source) JOIN reference_lot r ON r.id = n.source`,
      [codes, spectra, sources],
    );
  }
  return id;
}

async function bothSchemes(page: Page, name: string): Promise<void> {
  await screenshotWhole(page, `library-publishing-progress-${name}`);
  await page.emulateMedia({ colorScheme: 'dark' });
  await settleAnimations(page);
  findings.push(...(await accessibilityFindings(page, `${name} (dark)`)));
  await screenshotWhole(page, `library-publishing-progress-${name}-dark`);
  await page.emulateMedia({ colorScheme: 'light' });
}

beforeAll(async () => {
  const env = stackEnv();
  db = new Client({ host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), user: env.DATABASE_USER, password: env.DATABASE_PASSWORD, database: env.DATABASE_NAME });
  await db.connect();
  browser = await launchBrowser();
  versionId = await draftWithThousandsOfLots();
});

afterAll(async () => {
  try {
    process.kill(workerPid(), 'SIGCONT');
  } catch {
    // the worker is gone already
  }
  await db?.end();
  await browser?.close();
});

describe('a library of thousands of lots published by the worker', () => {
  it('counts the lots compared while the worker calibrates, then shows the version published', async () => {
    const total = (MEASURED + EXTRA).toLocaleString('en-GB');
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await page.goto(url(`/lab/libraries/versions/${versionId}`));
    await page.getByRole('button', { name: 'Publish version 1' }).click();
    const counting = page.getByText(new RegExp(`^Comparing lots: [0-9,]+ of ${total} \\(\\d+ %\\)…$`));
    await counting.waitFor({ timeout: 120_000 });
    const first = await counting.textContent();
    // The count moves while the calibration runs.
    await page.waitForFunction((before) => {
      const now = Array.from(document.querySelectorAll('strong'), (e) => e.textContent ?? '').find((t) => t.startsWith('Comparing lots') || t.startsWith('All '));
      return now !== undefined && now !== before;
    }, first, { timeout: 120_000 });
    if (await counting.count()) {
      process.kill(workerPid(), 'SIGSTOP');
      try {
        const bar = page.getByRole('progressbar', { name: /lots compared/ });
        expect(Number(await bar.getAttribute('aria-valuenow'))).toBeGreaterThan(0);
        await bothSchemes(page, 'comparing');
      } finally {
        process.kill(workerPid(), 'SIGCONT');
      }
    }
    await page.getByRole('button', { name: 'Retire' }).waitFor({ timeout: 180_000 });
    await page.getByText(/published/).first().waitFor();
    expect(await page.getByText(/^Comparing lots/).count()).toBe(0);
    await context.close();
  });

  it('no accessibility findings on these screens, light or dark', () => {
    expect(describeFindings([...accessibilitySoFar().findings, ...findings])).toBe('');
  });
});
