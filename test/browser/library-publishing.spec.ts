// A reviewer publishes a library version large enough to go to the worker: the version screen says
// it is waiting, then that it is calibrating its lots, then shows the published version. Then an
// analyst analyses a sample against it through an API whose analysis threshold it exceeds: the
// analysis tab says it is scoring against the lots until the worker is done. The worker is paused
// (SIGSTOP) and the row the job needs held, only to keep each state on screen long enough to
// photograph; the work itself is the real job. Checked by axe, light and dark.
import { spawn, type ChildProcess } from 'node:child_process';
import { openSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { Client } from 'pg';
import { DEMO_CELL_CONSTANT } from '../../docker-free-scripts/seed/lab-demo-files';
import { demoRandom, demoSweeps, DEMO_PROFILES, seedFrom, suspectParameters } from '../../docker-free-scripts/seed/lab-demo-spectra';
import { accessibilityFindings, describeFindings, settleAnimations, type ScreenFinding } from './support/accessibility';
import { DEMO_PASSWORD, launchBrowser, url } from './support/browser';
import { accessTokenFor, accessibilitySoFar, screenshotWhole, signInAt } from './support/desk';
import { measuredLotsDraft } from './support/measured-lots-draft';
import { BROWSER_PORT, ROOT, stackEnv } from './support/stack';

const PRODUCT = 'Hollin Medlar (browser test)';
const LOTS = 12; // above the stack's LIBRARY_PUBLISH_JOB_LOTS (10)
let browser: Browser;
let db: Client;
let versionId: string;
let medlarOrderId: string;
const findings: ScreenFinding[] = [];
let secondApi: ChildProcess | null = null;

/** One more API process on the same database whose analyses of more than 10 lots go to the worker (the Medlar library has 12). */
async function apiWithSmallAnalysisThreshold(): Promise<string> {
  const port = BROWSER_PORT + 1;
  const base = `http://127.0.0.1:${port}`;
  const out = openSync(join(ROOT, '.data', 'logs', 'api-browser-test-2.log'), 'w');
  secondApi = spawn('node', [join(ROOT, 'dist', 'api', 'apps', 'api', 'src', 'main.js')], { env: { ...stackEnv(), PORT: String(port), PUBLIC_BASE_URL: base, ANALYSIS_JOB_LOTS: '10' }, stdio: ['ignore', out, out] });
  for (let i = 0; i < 120; i++) {
    if (await fetch(`${base}/api/health`).then((r) => r.ok, () => false)) return base;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error('the second API did not answer /api/health');
}

const workerPid = () => Number(readFileSync(join(ROOT, '.data', 'run', 'worker-browser-test.pid'), 'utf8'));

/** The producer's enrolled lots, measured through the upload route, and an analyst's draft of them. */
async function draftWithManyLots(): Promise<string> {
  const { draftId, orderId } = await measuredLotsDraft(db, { product: PRODUCT, lots: LOTS, codePrefix: 'HM', lotPrefix: 'HM', seed: 'browser-medlar', methodName: 'Medlar screening' });
  medlarOrderId = orderId;
  return draftId;
}

async function bothSchemes(page: Page, name: string): Promise<void> {
  await screenshotWhole(page, `library-publishing-${name}`);
  await page.emulateMedia({ colorScheme: 'dark' });
  await settleAnimations(page);
  findings.push(...(await accessibilityFindings(page, `${name} (dark)`)));
  await screenshotWhole(page, `library-publishing-${name}-dark`);
  await page.emulateMedia({ colorScheme: 'light' });
}

beforeAll(async () => {
  const env = stackEnv();
  db = new Client({ host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), user: env.DATABASE_USER, password: env.DATABASE_PASSWORD, database: env.DATABASE_NAME });
  await db.connect();
  browser = await launchBrowser();
  versionId = await draftWithManyLots();
});

afterAll(async () => {
  if (secondApi?.pid) process.kill(secondApi.pid, 'SIGTERM');
  try {
    process.kill(workerPid(), 'SIGCONT');
  } catch {
    // the worker is gone already
  }
  await db?.end();
  await browser?.close();
});

describe('a large library version published by the worker', () => {
  it('shows waiting, then calibrating its lots, then the published version', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await page.goto(url(`/lab/libraries/versions/${versionId}`));
    process.kill(workerPid(), 'SIGSTOP');
    let held: Client | null = null;
    try {
      await page.getByRole('button', { name: 'Publish version 1' }).click();
      await page.getByText('Waiting to publish…').waitFor();
      await bothSchemes(page, 'queued');
      // hold the version row: the worker takes the job (running) and waits for the row
      const env = stackEnv();
      held = new Client({ host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), user: env.DATABASE_USER, password: env.DATABASE_PASSWORD, database: env.DATABASE_NAME });
      await held.connect();
      await held.query('BEGIN');
      await held.query('SELECT 1 FROM library_version WHERE id = $1 FOR UPDATE', [versionId]);
      process.kill(workerPid(), 'SIGCONT');
      await page.getByText(`Calibrating ${LOTS} lots…`).waitFor({ timeout: 30_000 });
      await bothSchemes(page, 'running');
      await held.query('ROLLBACK');
    } finally {
      process.kill(workerPid(), 'SIGCONT');
      await held?.end();
    }
    await page.getByRole('button', { name: 'Retire' }).waitFor({ timeout: 60_000 });
    await page.getByText(/published/).first().waitFor();
    expect(await page.getByText('Waiting to publish…').count()).toBe(0);
    await bothSchemes(page, 'published');
    const { rows } = await db.query(`SELECT count(*)::int AS n FROM audit_event WHERE subject_id = $1 AND action = 'library.version-published'`, [versionId]);
    expect(rows[0].n).toBe(1);
    await context.close();
  });

  it('the analysis screen shows scoring against the lots until the worker is done', async () => {
    const base = await apiWithSmallAnalysisThreshold();
    const { rows: [lab] } = await db.query(`SELECT id FROM lab WHERE name = 'Calder Analytical'`);
    const code = 'OP-HMCK-01';
    const { rows: [sample] } = await db.query(
      `INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, received_at) VALUES ($1, $2, $3, 'accepted', 'Shop shelf (invented test sample)', '2026-11-01', now()) RETURNING id`,
      [lab.id, medlarOrderId, code],
    );
    const token = await accessTokenFor('analyst@calder.test');
    const bench = (await (await fetch(url('/api/lab/bench'), { headers: { Authorization: `Bearer ${token}` } })).json()) as { instruments: { id: string }[]; cells: { id: string }[] };
    const profile = DEMO_PROFILES['cloudy-apple'];
    const rng = demoRandom(seedFrom('browser-medlar:check'));
    const form = new FormData();
    form.append('instrumentId', bench.instruments[0].id);
    form.append('cellId', bench.cells[0].id);
    form.append('temperatureC', '20');
    demoSweeps(suspectParameters(profile, { kind: 'none' }, rng), profile.model, { cellConstantPerCm: DEMO_CELL_CONSTANT, temperatureC: 20, referenceTemperatureC: 20, coefficientPerC: 0.02 }, 2, rng).forEach((s, r) => {
      const rows = Array.from(s.frequencyHz, (f, k) => `${f},${s.re[k]},${s.im[k]}`);
      form.append('files', new Blob([["Frequency (Hz),Z' (Ohm),Z'' (Ohm)", ...rows].join('\n') + '\n']), `medlar-check-rep${r + 1}.csv`);
    });
    const uploaded = await fetch(url(`/api/lab/samples/${code}/measurements`), { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
    expect(uploaded.status).toBe(201);

    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    page.setDefaultTimeout(60_000);
    await page.goto(`${base}/lab/sign-in`);
    await page.getByLabel('E-mail').fill('analyst@calder.test');
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('button', { name: /^Account menu for / }).waitFor();
    await page.goto(`${base}/lab/samples/${sample.id}`);
    await page.getByRole('tab', { name: 'Analysis' }).click();
    process.kill(workerPid(), 'SIGSTOP');
    let held: Client | null = null;
    try {
      await page.getByRole('button', { name: 'Run analysis' }).click();
      await page.getByText(`Scoring against ${LOTS} lots…`).waitFor();
      await page.getByText(/Waiting for a worker/).waitFor();
      await bothSchemes(page, 'analysis-queued');
      // hold the sample row: the worker takes the job (running) and waits for the row
      const env = stackEnv();
      held = new Client({ host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), user: env.DATABASE_USER, password: env.DATABASE_PASSWORD, database: env.DATABASE_NAME });
      await held.connect();
      await held.query('BEGIN');
      await held.query('SELECT 1 FROM sample WHERE id = $1 FOR UPDATE', [sample.id]);
      process.kill(workerPid(), 'SIGCONT');
      await page.getByText(/Waiting for a worker/).waitFor({ state: 'detached', timeout: 30_000 });
      await page.getByText(`Scoring against ${LOTS} lots…`).waitFor();
      await bothSchemes(page, 'analysis-running');
      await held.query('ROLLBACK');
    } finally {
      process.kill(workerPid(), 'SIGCONT');
      await held?.end();
    }
    await page.getByRole('button', { name: 'Submit for review' }).waitFor();
    expect(await page.getByText(`Scoring against ${LOTS} lots…`).count()).toBe(0);
    await bothSchemes(page, 'analysis-done');
    const { rows } = await db.query(`SELECT count(*)::int AS n FROM analysis WHERE sample_id = $1`, [sample.id]);
    expect(rows[0].n).toBe(1);
    await context.close();
  });

  it('no accessibility findings on these screens, light or dark', () => {
    expect(describeFindings([...accessibilitySoFar().findings, ...findings])).toBe('');
  });
});
