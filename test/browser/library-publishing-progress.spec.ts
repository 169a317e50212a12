// A reviewer publishes a library version of a few thousand lots: while the worker calibrates, the
// version screen counts the lots compared so far with a filling bar, and the count moves; then the
// version reads published. The worker is paused (SIGSTOP) for a moment only to photograph the
// count; the calibration itself is the real job. Checked by axe, light and dark.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { Client } from 'pg';
import { DEMO_CELL_CONSTANT } from '../../docker-free-scripts/seed/lab-demo-files';
import { demoRandom, demoSweeps, DEMO_PROFILES, seedFrom, suspectParameters } from '../../docker-free-scripts/seed/lab-demo-spectra';
import { DEFAULT_METHOD } from '../../apps/api/src/modules/libraries/default-method';
import { decodeLotSpectrum, encodeLotSpectrum } from '../../apps/api/src/modules/libraries/lot-spectrum-bytes';
import { accessibilityFindings, describeFindings, settleAnimations, type ScreenFinding } from './support/accessibility';
import { launchBrowser, url } from './support/browser';
import { accessTokenFor, accessibilitySoFar, screenshotWhole, signInAt } from './support/desk';
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

async function api(path: string, email: string, init: RequestInit = {}): Promise<Response> {
  const token = await accessTokenFor(email);
  return fetch(url(path), { ...init, headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', ...(init.headers ?? {}) } });
}

/** A draft of a few measured lots, then thousands more: each a measured lot with a little invented scatter. */
async function draftWithThousandsOfLots(): Promise<string> {
  const { rows: [lab] } = await db.query(`SELECT id FROM lab WHERE name = 'Calder Analytical'`);
  const { rows: [client] } = await db.query(`SELECT id FROM client_organisation WHERE lab_id = $1 AND name = 'Sunvale Juice Works'`, [lab.id]);
  const { rows: [placer] } = await db.query(`SELECT placed_by_user_id AS id FROM test_order WHERE client_organisation_id = $1 LIMIT 1`, [client.id]);
  const { rows: [product] } = await db.query(`INSERT INTO product (lab_id, client_organisation_id, name, matrix) VALUES ($1, $2, $3, 'juice') RETURNING id`, [lab.id, client.id, PRODUCT]);
  const { rows: [order] } = await db.query(`INSERT INTO test_order (lab_id, client_organisation_id, product_id, status, placed_by_user_id) VALUES ($1, $2, $3, 'in-progress', $4) RETURNING id`, [lab.id, client.id, product.id, placer.id]);
  const token = await accessTokenFor('analyst@calder.test');
  const bench = (await (await fetch(url('/api/lab/bench'), { headers: { Authorization: `Bearer ${token}` } })).json()) as { instruments: { id: string }[]; cells: { id: string }[] };
  const profile = DEMO_PROFILES['cloudy-apple'];
  for (let i = 0; i < MEASURED; i++) {
    const code = `OP-BP${String(i).padStart(2, '0')}-RF`;
    await db.query(
      `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, kind, reference_lot, received_at)
       VALUES ($1, $2, $3, 'accepted', 'Producer (invented test lot)', '2026-10-01', 'reference-lot', $4, now())`,
      [lab.id, order.id, code, JSON.stringify({ lotCode: `BP-${String(i + 1).padStart(3, '0')}`, producedOn: `2026-0${1 + (i % 9)}-15`, volumeMl: 500 })],
    );
    const rng = demoRandom(seedFrom(`browser-perry:${i}`));
    const conditions = { cellConstantPerCm: DEMO_CELL_CONSTANT, temperatureC: 20, referenceTemperatureC: 20, coefficientPerC: 0.02 };
    const form = new FormData();
    form.append('instrumentId', bench.instruments[0].id);
    form.append('cellId', bench.cells[0].id);
    form.append('temperatureC', '20');
    demoSweeps(suspectParameters(profile, { kind: 'none' }, rng), profile.model, conditions, 2, rng).forEach((s, r) => {
      const rows = Array.from(s.frequencyHz, (f, k) => `${f},${s.re[k]},${s.im[k]}`);
      form.append('files', new Blob([["Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...rows].join('\n') + '\n']), `perry-${i + 1}-rep${r + 1}.csv`);
    });
    const res = await fetch(url(`/api/lab/samples/${code}/measurements`), { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
    if (res.status !== 201) throw new Error(`uploading ${code} answered ${res.status}: ${await res.text()}`);
  }
  const method = await api('/api/lab/methods', 'admin@calder.test', { method: 'POST', body: JSON.stringify({ name: 'Perry screening', matrix: 'juice', settings: { ...DEFAULT_METHOD, model: 'cole-cole' } }) });
  if (method.status !== 201) throw new Error(`method answered ${method.status}: ${await method.text()}`);
  const draft = await api('/api/lab/library-drafts', 'analyst@calder.test', { method: 'POST', body: JSON.stringify({ productId: product.id, methodVersionId: ((await method.json()) as { id: string }).id }) });
  if (draft.status !== 201) throw new Error(`draft answered ${draft.status}: ${await draft.text()}`);
  const id = ((await draft.json()) as { id: string }).id;

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
