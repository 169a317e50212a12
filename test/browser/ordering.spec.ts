// A producer orders checks in a real browser: products, enrolment and the ordering stepper, the
// label pack, credits held per sample; intake receives one sample (with the client's shipment
// pre-filled), its report is issued and its credit spent. Every new screen is checked with axe-core
// in the light and the dark scheme.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { describeFindings } from './support/accessibility';
import { launchBrowser, screenshot, url } from './support/browser';
import { accessTokenFor, accessibilitySoFar, openFromMenu, screenshotWhole, signInAt, type Desk } from './support/desk';
import { exportsFor } from './support/replicate-exports';
import { ARTIFACTS, stackEnv } from './support/stack';

const CLIENT_ADMIN = 'admin@hollinridge.test';
const INTAKE = 'intake@calder.test';
const ANALYST = 'analyst@calder.test';
const REVIEWER = 'reviewer@calder.test';
const STARTING_CREDITS = 5;

jest.setTimeout(240_000);

let browser: Browser;
const desks: Desk[] = [];
const handOn: { orderId?: string; codes?: string[]; sampleIds?: string[]; before?: { available: number; reserved: number } } = {};

function needs<K extends keyof typeof handOn>(key: K): NonNullable<(typeof handOn)[K]> {
  const value = handOn[key];
  if (value === undefined) throw new Error(`An earlier step did not produce ${key}; see its failure above.`);
  return value as NonNullable<(typeof handOn)[K]>;
}

async function deskOf(portal: 'lab' | 'client', email: string): Promise<Desk> {
  const desk = await signInAt(browser, portal, email);
  desks.push(desk);
  return desk;
}

/** Photographs the screen and checks it with axe-core in the light scheme, then in the dark one. */
async function lookAt(page: Page, name: string): Promise<void> {
  await screenshotWhole(page, name);
  await page.emulateMedia({ colorScheme: 'dark' });
  await screenshotWhole(page, `${name}-dark`);
  await page.emulateMedia({ colorScheme: 'light' });
}

async function api<T>(email: string, path: string, init: RequestInit = {}): Promise<T> {
  const res = await fetch(url(path), { ...init, headers: { authorization: `Bearer ${await accessTokenFor(email)}`, ...(init.headers ?? {}) } });
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${path} answered ${res.status}: ${await res.text()}`);
  return (res.status === 204 ? undefined : await res.json()) as T;
}

async function credits(): Promise<{ available: number; reserved: number }> {
  const { available, reserved } = await api<{ available: number; reserved: number }>(CLIENT_ADMIN, '/api/client/order-prices');
  return { available, reserved };
}

/** Buying is the billing pages' job: the demo producer gets its credits straight through the ledger core. */
async function giveCredits(amount: number): Promise<void> {
  Object.assign(process.env, stackEnv());
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  const { addCredits } = await import('../../apps/api/src/modules/credits/credit-ledger');
  const env = stackEnv();
  dataSource.setOptions({ host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), username: env.DATABASE_USER, password: env.DATABASE_PASSWORD,
    database: env.DATABASE_NAME, poolSize: 1, logging: [] });
  await dataSource.initialize();
  try {
    const [org] = await dataSource.query(`SELECT id, lab_id FROM client_organisation WHERE name = 'Hollin Ridge Cellars'`);
    await dataSource.transaction((m) => addCredits(m, { labId: org.lab_id, clientOrganisationId: org.id }, amount, 'adjustment',
      { reason: 'Browser journey set-up (invented demo)', actorUserId: null }));
  } finally {
    await dataSource.destroy();
  }
}

beforeAll(async () => {
  browser = await launchBrowser();
  await giveCredits(STARTING_CREDITS);
});

afterAll(async () => {
  for (const d of desks) await d.context.close();
  await browser?.close();
});

describe('a producer orders checks and the credits follow the samples', () => {
  it('1. the client admin sees products with their library state and the enrolment form', async () => {
    const { page } = await deskOf('client', CLIENT_ADMIN);
    await openFromMenu(page, 'Products');
    const table = page.getByRole('table', { name: 'Products', exact: true });
    await table.getByRole('row').filter({ hasText: 'Ridgeline Red (demo)' }).filter({ hasText: /Library published, version \d+/ }).waitFor();
    await table.getByRole('row').filter({ hasText: 'Hollin Sparkling Rosé (demo)' }).filter({ hasText: 'Library being built' }).waitFor();
    await lookAt(page, 'ordering-01-products');

    await page.getByRole('button', { name: 'Register a product' }).click();
    await page.getByRole('dialog').getByLabel('Name').waitFor();
    await lookAt(page, 'ordering-01b-product-dialog');
    await page.getByRole('dialog').getByRole('button', { name: 'Cancel' }).click();

    await table.getByRole('row').filter({ hasText: 'Hollin Sparkling Rosé (demo)' }).getByRole('link', { name: 'Enrol lots' }).click();
    await page.getByRole('heading', { level: 1, name: /Enrol reference lots of Hollin Sparkling Rosé/ }).waitFor();
    await page.getByLabel('Lot code').fill('HSR-25-04');
    await page.getByText('Known chemistry (optional)').click();
    await page.getByLabel('Alcohol (% vol)').fill('11.5');
    await lookAt(page, 'ordering-02-enrolment');
  });

  it('2. orders two checks through the stepper; two credits are held', async () => {
    const { page } = desks[0];
    const before = await credits();
    await page.goto(url('/orders/new'));
    await page.getByRole('radio', { name: /Ridgeline Red \(demo\)/ }).check();
    await page.getByText('Hollin Sparkling Rosé (demo) — its library is being built.').waitFor();
    await lookAt(page, 'ordering-03a-new-check-product');
    await page.getByRole('button', { name: 'Next: the samples' }).click();
    await page.getByRole('button', { name: 'Add another sample' }).click();
    const samples = page.locator('li.sample');
    for (const [i, where] of ['Harbour Street corner shop (invented)', 'Quayside market stall (invented)'].entries()) {
      const s = samples.nth(i);
      await s.getByLabel('Where it was obtained').fill(where);
      await s.getByLabel('When it was obtained').fill('2026-11-20');
      await s.getByLabel('Lot claimed on the label').fill(`L24-14${i}`);
      await s.getByLabel('Container').fill('750 mL green glass bottle');
      await s.getByLabel('Label text').fill('Ridgeline Red 2023, Hollin Ridge Cellars (invented)');
    }
    await lookAt(page, 'ordering-03b-new-check-samples');
    await page.getByRole('button', { name: 'Next: review and confirm' }).click();
    await page.getByText('2 credits').first().waitFor();
    await lookAt(page, 'ordering-03c-new-check-review');
    await page.getByRole('button', { name: 'Place order' }).click();
    await page.waitForURL(/\/orders\/[0-9a-f-]{36}$/);
    handOn.orderId = new URL(page.url()).pathname.split('/').pop();
    const order = await api<{ samples: { id: string; code: string }[] }>(CLIENT_ADMIN, `/api/client/orders/${handOn.orderId}`);
    handOn.codes = order.samples.map((s) => s.code);
    handOn.sampleIds = order.samples.map((s) => s.id);
    expect(handOn.codes).toHaveLength(2);
    await page.getByText('1 credit held').first().waitFor();
    expect(await credits()).toEqual({ available: before.available - 2, reserved: before.reserved + 2 });
    handOn.before = before;

    await page.getByLabel('Carrier').fill('Invented Parcel Ltd');
    await page.getByLabel('Tracking number (optional)').fill('IPL-BROWSER-1');
    await page.getByRole('button', { name: 'Record shipment' }).click();
    await page.getByText(/Shipped .* with Invented Parcel Ltd, tracking number IPL-BROWSER-1\./).waitFor();
    await lookAt(page, 'ordering-04-order-detail');
  });

  it('3. downloads the label pack: every code, the lab’s address and the custody form', async () => {
    const { page } = desks[0];
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download label pack' }).click()]);
    const file = join(ARTIFACTS, 'ordering-label-pack.pdf');
    await download.saveAs(file);
    expect(readFileSync(file).subarray(0, 5).toString()).toBe('%PDF-');
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    for (const code of needs('codes')) expect(text).toContain(code);
    expect(text).toContain('How to send them');
    expect(text).toContain('sample reception');
    expect(text).toContain('Chain-of-custody form');
    execFileSync('pdftoppm', ['-png', '-r', '50', file, join(ARTIFACTS, 'ordering-label-pack')]);
  });

  it('4. the orders list keeps its filters in the address and fits a phone', async () => {
    const { page } = desks[0];
    await openFromMenu(page, 'Orders');
    await page.locator('mat-button-toggle').filter({ hasText: /^\s*Placed\s*$/ }).click();
    await page.waitForURL(/status=placed/);
    await page.getByRole('table', { name: 'Orders', exact: true }).getByRole('row').filter({ hasText: needs('codes')[0] }).waitFor();
    await lookAt(page, 'ordering-05-orders');
    await page.setViewportSize({ width: 390, height: 844 });
    await page.reload();
    await page.getByRole('table', { name: 'Orders', exact: true }).getByRole('row').filter({ hasText: needs('codes')[0] }).waitFor();
    await screenshot(page, 'ordering-05b-orders-phone');
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(url('/'));
    await page.getByRole('heading', { name: 'Open orders' }).waitFor();
    await lookAt(page, 'ordering-06-home');
  });

  it('5. intake receives one sample, with the client’s carrier and tracking number filled in', async () => {
    const [code] = needs('codes');
    const { page } = await deskOf('lab', INTAKE);
    await openFromMenu(page, 'Receive samples');
    const field = page.getByLabel('Sample code');
    await field.fill(code);
    await field.press('Enter');
    await page.getByText('Shipped by client').waitFor();
    expect(await page.getByLabel('Carrier').inputValue()).toBe('Invented Parcel Ltd');
    expect(await page.getByLabel('Tracking number').inputValue()).toBe('IPL-BROWSER-1');
    await page.getByLabel('Temperature on arrival').fill('15');
    await page.getByRole('combobox', { name: 'Container condition' }).click();
    await page.getByRole('option', { name: 'intact' }).click();
    await page.getByLabel('Volume').fill('750');
    await screenshotWhole(page, 'ordering-07-intake');
    await page.getByRole('button', { name: 'Record arrival' }).click();
    await page.getByLabel('Storage location').fill('Wine cellar rack 4 (demo)');
    await page.getByRole('button', { name: 'Accept and store' }).click();
    await page.getByText(`${code} accepted and stored at Wine cellar rack 4 (demo).`).first().waitFor();
  });

  it('6. the report is issued and the sample’s credit is spent; the other stays held', async () => {
    const [sampleId] = needs('sampleIds');
    const [code] = needs('codes');
    const bench = await api<{ instruments: { id: string }[]; cells: { id: string }[] }>(ANALYST, '/api/lab/bench');
    const form = new FormData();
    form.append('instrumentId', bench.instruments[0].id);
    form.append('cellId', bench.cells[0].id);
    form.append('temperatureC', '22.5');
    for (const path of exportsFor(code).paths.filter((p) => !p.includes('broken'))) {
      form.append('files', new Blob([readFileSync(path)]), path.split('/').pop());
    }
    await api(ANALYST, `/api/lab/samples/${sampleId}/measurements`, { method: 'POST', body: form });
    const libraries = await api<{ items: { product: { name: string }; versions: { id: string; status: string }[] }[] }>(ANALYST, '/api/lab/libraries?pageSize=100');
    const versionId = libraries.items.find((l) => l.product.name === 'Ridgeline Red (demo)')?.versions.find((v) => v.status === 'published')?.id;
    const analysis = await api<{ id: string }>(ANALYST, `/api/lab/samples/${sampleId}/analyses`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ libraryVersionId: versionId }),
    });
    await api(ANALYST, `/api/lab/analyses/${analysis.id}/submit`, { method: 'POST' });
    await api(REVIEWER, `/api/lab/analyses/${analysis.id}/approve`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ comments: 'Agreed (browser journey).' }),
    });
    // the approval is answered at once; the worker issues the report (and spends the credit) a moment later
    for (let i = 0; ; i++) {
      const issuance = await api<{ state: string }>(REVIEWER, `/api/lab/analyses/${analysis.id}/issuance`);
      if (issuance.state === 'issued') break;
      if (issuance.state === 'failed' || i > 300) throw new Error(`the report was not issued: ${JSON.stringify(issuance)}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    const before = needs('before');
    expect(await credits()).toEqual({ available: before.available - 2, reserved: before.reserved + 1 });

    const { page } = desks[0];
    await page.goto(url(`/orders/${needs('orderId')}`));
    await page.getByText('1 credit spent').waitFor();
    await page.getByText('1 credit held').waitFor();
    await lookAt(page, 'ordering-08-order-reported');
  });

  it('every screen photographed passes the automated accessibility checks, light and dark', () => {
    const { screens, findings } = accessibilitySoFar();
    expect(screens.length).toBeGreaterThanOrEqual(16);
    expect(describeFindings(findings)).toBe('');
  });
});
