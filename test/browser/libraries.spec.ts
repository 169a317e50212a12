// A lab defines a method, builds a library from reference lots and publishes it, entirely in the
// lab portal: the lab admin saves a method version (previewing its model on a real spectrum), the
// analyst starts a draft from the product's measured reference lots and sets one aside with a
// reason, and a reviewer publishes it. Each new screen is checked by axe, light and dark.
import type { Browser, Page } from 'playwright-core';
import { Client } from 'pg';
import { DEMO_CELL_CONSTANT } from '../../docker-free-scripts/seed/lab-demo-files';
import { demoRandom, demoSweeps, DEMO_PROFILES, seedFrom, suspectParameters } from '../../docker-free-scripts/seed/lab-demo-spectra';
import { accessibilityFindings, describeFindings, settleAnimations, type ScreenFinding } from './support/accessibility';
import { launchBrowser, url } from './support/browser';
import { accessTokenFor, accessibilitySoFar, screenshotWhole, signInAt } from './support/desk';
import { stackEnv } from './support/stack';

const PRODUCT = 'Sunvale Quince (browser test)';
const LOTS = 8;
let browser: Browser;
const findings: ScreenFinding[] = [];

/** The producer's enrolled lots as the lab receives them: accepted reference-lot samples, measured through the upload route. */
async function enrolLots(): Promise<void> {
  const env = stackEnv();
  const db = new Client({ host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), user: env.DATABASE_USER, password: env.DATABASE_PASSWORD, database: env.DATABASE_NAME });
  await db.connect();
  try {
    const { rows: [lab] } = await db.query(`SELECT id FROM lab WHERE name = 'Calder Analytical'`);
    const { rows: [client] } = await db.query(`SELECT id FROM client_organisation WHERE lab_id = $1 AND name = 'Sunvale Juice Works'`, [lab.id]);
    const { rows: [placer] } = await db.query(`SELECT placed_by_user_id AS id FROM test_order WHERE client_organisation_id = $1 LIMIT 1`, [client.id]);
    const { rows: [product] } = await db.query(`INSERT INTO product (lab_id, client_organisation_id, name, matrix) VALUES ($1, $2, $3, 'juice') RETURNING id`, [lab.id, client.id, PRODUCT]);
    const { rows: [order] } = await db.query(`INSERT INTO test_order (lab_id, client_organisation_id, product_id, status, placed_by_user_id) VALUES ($1, $2, $3, 'in-progress', $4) RETURNING id`, [lab.id, client.id, product.id, placer.id]);
    const token = await accessTokenFor('analyst@calder.test');
    const bench = (await (await fetch(url('/api/lab/bench'), { headers: { Authorization: `Bearer ${token}` } })).json()) as { instruments: { id: string }[]; cells: { id: string }[] };
    const profile = DEMO_PROFILES['cloudy-apple'];
    for (let i = 0; i < LOTS; i++) {
      const code = `OP-QB${i}${i}-RF`;
      await db.query(
        `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, kind, reference_lot, received_at)
         VALUES ($1, $2, $3, 'accepted', 'Producer (invented test lot)', '2026-10-01', 'reference-lot', $4, now())`,
        [lab.id, order.id, code, JSON.stringify({ lotCode: `QB-${String(i + 1).padStart(3, '0')}`, producedOn: `2026-0${1 + i}-15`, volumeMl: 500 })],
      );
      const rng = demoRandom(seedFrom(`browser-lot:${i}`));
      const conditions = { cellConstantPerCm: DEMO_CELL_CONSTANT, temperatureC: 20, referenceTemperatureC: 20, coefficientPerC: 0.02 };
      const form = new FormData();
      form.append('instrumentId', bench.instruments[0].id);
      form.append('cellId', bench.cells[0].id);
      form.append('temperatureC', '20');
      demoSweeps(suspectParameters(profile, { kind: 'none' }, rng), profile.model, conditions, 2, rng).forEach((s, r) => {
        const rows = Array.from(s.frequencyHz, (f, k) => `${f},${s.re[k]},${s.im[k]}`);
        form.append('files', new Blob([["Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...rows].join('\n') + '\n']), `quince-${i + 1}-rep${r + 1}.csv`);
      });
      const res = await fetch(url(`/api/lab/samples/${code}/measurements`), { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
      if (res.status !== 201) throw new Error(`uploading ${code} answered ${res.status}: ${await res.text()}`);
    }
  } finally {
    await db.end();
  }
}

async function bothSchemes(page: Page, name: string): Promise<void> {
  await screenshotWhole(page, `libraries-${name}`);
  await page.emulateMedia({ colorScheme: 'dark' });
  await settleAnimations(page);
  findings.push(...(await accessibilityFindings(page, `${name} (dark)`)));
  await screenshotWhole(page, `libraries-${name}-dark`);
  await page.emulateMedia({ colorScheme: 'light' });
}

beforeAll(async () => {
  browser = await launchBrowser();
  await enrolLots();
});

afterAll(async () => {
  await browser?.close();
});

describe('a library built and published in the lab portal', () => {
  it('the lab admin defines a method version and previews its model on a real spectrum', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'admin@calder.test');
    await page.goto(url('/lab/libraries/methods'));
    await page.getByRole('heading', { name: 'Methods', level: 1 }).waitFor();
    await page.getByRole('button', { name: 'New method' }).click();
    await page.getByLabel('Name', { exact: true }).fill('Quince screening');
    await page.getByLabel('Matrix').click();
    await page.getByRole('option', { name: 'juice' }).click();
    await page.getByLabel('Spectrum').click();
    await page.getByRole('option').first().click();
    await page.getByRole('button', { name: 'Preview the fit' }).click();
    await page.getByText(/: converged, χ² = /).waitFor();
    await page.getByRole('button', { name: 'Save version' }).click();
    await page.getByRole('heading', { name: 'Quince screening, version 1' }).waitFor();
    await bothSchemes(page, 'methods');
    await context.close();
  });

  it('the analyst starts a draft from the measured reference lots and sets one lot aside with a reason', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'analyst@calder.test');
    await page.goto(url('/lab/libraries'));
    await page.getByLabel('Search products or producers').fill('Quince');
    const row = page.getByRole('row', { name: new RegExp(PRODUCT.replace(/[()]/g, '.')) });
    await row.getByText(String(LOTS), { exact: true }).waitFor();
    await bothSchemes(page, 'products');
    // the floating label lies over the select's box, so open it from the keyboard as a person tabbing would
    await row.getByRole('combobox', { name: 'Method version' }).focus();
    await page.keyboard.press('Enter');
    await page.getByRole('option', { name: 'Quince screening v1' }).click();
    await row.getByRole('button', { name: 'Start draft' }).click();
    await page.getByRole('heading', { name: `${PRODUCT} · library version 1` }).waitFor();
    await page.getByLabel('Reason for including or excluding').fill('Label of this lot smudged on arrival');
    const lots = page.getByRole('table', { name: 'Lots of this version' });
    await lots.getByRole('button', { name: 'Exclude' }).first().click();
    await page.getByRole('heading', { name: new RegExp(`Lots \\(${LOTS - 1} included, 1 excluded\\)`) }).waitFor();
    await bothSchemes(page, 'draft');
    await context.close();
  });

  it('a reviewer publishes it; the screen states the estimator, n and the intervals', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await page.goto(url('/lab/libraries'));
    await page.getByLabel('Search products or producers').fill('Quince');
    await page.getByRole('link', { name: /v1 draft/ }).click();
    await page.getByRole('button', { name: 'Publish version 1' }).click();
    // published, the version offers retiring instead of publishing
    await page.getByRole('button', { name: 'Retire' }).waitFor();
    await page.getByText('Lognormal fitted by maximum likelihood').waitFor();
    await page.getByText(/95\s?% percentile bootstrap, 2000 resamples/).waitFor();
    await bothSchemes(page, 'published');
    await context.close();
  });

  it('no accessibility findings on the new screens, light or dark', () => {
    expect(describeFindings([...accessibilitySoFar().findings, ...findings])).toBe('');
  });
});
