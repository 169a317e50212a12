// Lists keep their state in the URL, and phones still see every status. A reload, a link sent to a
// colleague and the browser's Back button all bring back the same search, filters, sort and page,
// in both portals; at phone width (390 × 844) the Orders and Reports lists keep the status column
// on screen (a revoked report's included) and the verification page reached from a QR code shows
// its result above the fold. Every screen here is checked with axe-core, light and dark.
import { join } from 'node:path';
import type { Browser, Locator, Page } from 'playwright-core';
import { accessibilityFindings, describeFindings, type ScreenFinding } from './support/accessibility';
import { launchBrowser, url } from './support/browser';
import { signInAt } from './support/desk';
import { apiJson as api, measureAndAnalyse } from './support/lab-api';
import { ARTIFACTS } from './support/stack';

/** A seeded Ridgeline Red sample with demo exports that no other journey measures. */
const SAMPLE = 'OP-2HNB-5W';
const PHONE = { width: 390, height: 844 };
const LAB_ADMIN = 'admin@calder.test';
const CLIENT_ADMIN = 'admin@hollinridge.test';

let browser: Browser;
const findings: ScreenFinding[] = [];
const revoked: { number?: string; code?: string } = {};


/** Measures, analyses, approves and then revokes the sample's report, all through the API. */
async function revokedReport(): Promise<{ number: string; code: string }> {
  const analyst = 'analyst@calder.test';
  const analysis = { id: (await measureAndAnalyse(SAMPLE)).analysisId };
  await api(analyst, `/api/lab/analyses/${analysis.id}/submit`, { method: 'POST', body: '{}' });
  await api('reviewer@calder.test', `/api/lab/analyses/${analysis.id}/approve`, { method: 'POST', body: JSON.stringify({ comments: 'Agreed (lists browser test).' }) });
  // issuance may finish after the approval answers: wait for the report to be listed
  let report: { id: string; number: string } | undefined;
  for (let i = 0; i < 120 && !report; i++) {
    report = (await api<{ items: { id: string; number: string }[] }>(LAB_ADMIN, `/api/lab/reports?q=${SAMPLE}`)).items[0];
    if (!report) await new Promise((r) => setTimeout(r, 500));
  }
  if (!report) throw new Error(`No report was issued for ${SAMPLE}`);
  await api(LAB_ADMIN, `/api/lab/reports/${report.id}/revoke`, { method: 'POST', body: JSON.stringify({ reason: 'Issued against the wrong lot record (invented demo revocation).' }) });
  const detail = await api<{ verificationCode: string }>(LAB_ADMIN, `/api/lab/reports/${report.id}`);
  return { number: report.number, code: detail.verificationCode };
}

beforeAll(async () => {
  browser = await launchBrowser();
  Object.assign(revoked, await revokedReport());
});

afterAll(async () => {
  await browser?.close();
});

/** The list has its rows: no progress bar left, the first data row drawn. */
async function listed(page: Page, table: string): Promise<void> {
  await page.getByRole('table', { name: table, exact: true }).getByRole('row').nth(1).waitFor();
  await page.waitForFunction(() => !document.querySelector('mat-progress-bar[mode="indeterminate"]'));
}

function query(page: Page): URLSearchParams {
  return new URL(page.url()).searchParams;
}

/** A single-choice toggle group's button is a radio: checked is chosen. */
/**
 * Whether the toggle shows as chosen once the page has caught up with its address: after Back the
 * browser changes the URL first and the list renders from it a moment later.
 */
async function pressed(toggle: Locator, withinMs = 15_000): Promise<boolean> {
  const until = Date.now() + withinMs;
  for (;;) {
    if ((await toggle.getAttribute('aria-checked')) === 'true') return true;
    if (Date.now() > until) return false;
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** What a search field shows once the page has caught up with its address (as `pressed`, after Back). */
async function shows(field: Locator, value: string, withinMs = 15_000): Promise<string> {
  const until = Date.now() + withinMs;
  for (;;) {
    const shown = await field.inputValue();
    if (shown === value || Date.now() > until) return shown;
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function look(page: Page, name: string, fullPage = false): Promise<void> {
  await page.screenshot({ path: join(ARTIFACTS, `lists-${name}.png`), fullPage });
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    findings.push(...(await accessibilityFindings(page, `${name} (${scheme})`)));
  }
  await page.emulateMedia({ colorScheme: 'light' });
}

/** The element lies wholly inside the viewport: seen without scrolling either way. */
async function expectOnScreen(page: Page, element: Locator): Promise<void> {
  const box = await element.boundingBox();
  const viewport = page.viewportSize()!;
  expect(box).not.toBeNull();
  expect(box!.x).toBeGreaterThanOrEqual(0);
  expect(box!.y).toBeGreaterThanOrEqual(0);
  expect(box!.x + box!.width).toBeLessThanOrEqual(viewport.width);
  expect(box!.y + box!.height).toBeLessThanOrEqual(viewport.height);
}

describe('lists keep their state in the URL, and phones keep the status in view', () => {
  it('1. lab reports: a filter and a search survive a reload, a shared link and Back', async () => {
    const { context, page } = await signInAt(browser, 'lab', LAB_ADMIN);
    await page.goto(url('/lab/reports'));
    await listed(page, 'Reports');
    const revokedToggle = page.getByRole('radiogroup', { name: 'Filter by status' }).getByRole('radio', { name: 'Revoked', exact: true });
    await revokedToggle.click();
    await page.waitForURL(/status=revoked/);
    await page.getByLabel('Search by report number, sample or client').fill(SAMPLE);
    await page.waitForURL(new RegExp(`q=${SAMPLE}`));
    await listed(page, 'Reports');
    const shared = page.url();

    await page.reload();
    await listed(page, 'Reports');
    expect(await pressed(revokedToggle)).toBe(true);
    expect(await page.getByLabel('Search by report number, sample or client').inputValue()).toBe(SAMPLE);
    await page.locator('td.mat-column-number', { hasText: revoked.number }).waitFor();
    // at desktop width the phone's folded details stay hidden: they have columns of their own
    expect(await page.locator('td.mat-column-number .ohm-narrow-only').first().isVisible()).toBe(false);
    await look(page, 'lab-reports-revoked-after-reload');

    // Back steps out of the search, then out of the filter
    await page.goBack();
    await page.waitForURL((u) => !u.searchParams.has('q'));
    expect(query(page).get('status')).toBe('revoked');
    expect(await shows(page.getByLabel('Search by report number, sample or client'), '')).toBe('');
    await page.goBack();
    await page.waitForURL((u) => !u.searchParams.has('status'));
    expect(await pressed(page.getByRole('radiogroup', { name: 'Filter by status' }).getByRole('radio', { name: 'All', exact: true }))).toBe(true);
    await context.close();

    // a colleague opens the link they were sent
    const reviewer = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await reviewer.page.goto(shared);
    await listed(reviewer.page, 'Reports');
    expect(await reviewer.page.getByRole('table', { name: 'Reports', exact: true }).getByRole('row').count()).toBe(2);
    await reviewer.page.locator('td.mat-column-number', { hasText: revoked.number }).waitFor();
    await reviewer.context.close();
  });

  it('2. lab work queue and staff: sort, states and page size survive a reload; nonsense in the URL opens the default list', async () => {
    const { context, page } = await signInAt(browser, 'lab', LAB_ADMIN);
    await page.goto(url('/lab/queue'));
    await listed(page, 'Work queue');
    await page.getByRole('columnheader', { name: 'Due' }).click();
    await page.waitForURL(/sort=due/);
    await page.getByRole('option', { name: 'Awaiting arrival' }).click();
    await page.waitForURL(/states=/);
    const states = query(page).get('states');
    await page.reload();
    await listed(page, 'Work queue');
    expect(query(page).get('states')).toBe(states);
    expect(await page.getByRole('columnheader', { name: 'Due' }).getAttribute('aria-sort')).toBe('ascending');
    expect(await page.getByRole('option', { name: 'Awaiting arrival' }).getAttribute('aria-selected')).toBe(String(states!.includes('awaiting-arrival')));
    await look(page, 'lab-queue-sorted-by-due');

    await page.goto(url('/lab/staff?sort=email&dir=desc&pageSize=10'));
    await listed(page, 'Staff');
    expect(await page.getByRole('columnheader', { name: 'E-mail' }).getAttribute('aria-sort')).toBe('descending');
    const emails = await page.getByRole('table', { name: 'Staff', exact: true }).locator('td.mat-column-email').allTextContents();
    expect(emails.length).toBeGreaterThan(1);
    expect([...emails].sort().reverse()).toEqual(emails);

    await page.goto(url('/lab/reports?status=deleted&page=-3&sort=%00drop&pageSize=7&dir=up'));
    await listed(page, 'Reports');
    expect(await pressed(page.getByRole('radiogroup', { name: 'Filter by status' }).getByRole('radio', { name: 'All', exact: true }))).toBe(true);
    expect(await page.getByRole('columnheader', { name: 'Issued' }).getAttribute('aria-sort')).toBe('descending');
    expect(await page.locator('mat-snack-bar-container').count()).toBe(0);
    await context.close();
  });

  it('3. client orders, reports and notifications: filters and search survive a reload and a shared link', async () => {
    const { context, page } = await signInAt(browser, 'client', CLIENT_ADMIN);
    await page.goto(url('/orders'));
    await listed(page, 'Orders');
    await page.getByRole('radiogroup', { name: 'Filter by kind' }).getByRole('radio', { name: 'Checks', exact: true }).click();
    await page.waitForURL(/kind=check/);
    await page.getByRole('columnheader', { name: 'Product' }).click();
    await page.waitForURL(/sort=product/);
    await page.reload();
    await listed(page, 'Orders');
    expect(await pressed(page.getByRole('radiogroup', { name: 'Filter by kind' }).getByRole('radio', { name: 'Checks', exact: true }))).toBe(true);
    expect(await page.getByRole('columnheader', { name: 'Product' }).getAttribute('aria-sort')).toBe('ascending');
    await look(page, 'client-orders-checks-by-product', true);

    await page.goto(url(`/reports?q=${revoked.number}`));
    await listed(page, 'Reports');
    expect(await page.getByLabel('Search by report number, sample code or product').inputValue()).toBe(revoked.number);
    expect(await page.getByRole('table', { name: 'Reports', exact: true }).getByRole('row').count()).toBe(2);

    await page.goto(url('/notifications'));
    await page.getByRole('heading', { name: 'Notifications', level: 1 }).waitFor();
    await page.getByRole('switch', { name: 'Unread only' }).click();
    await page.waitForURL(/unread=true/);
    await page.reload();
    await page.getByRole('heading', { name: 'Notifications', level: 1 }).waitFor();
    expect(await page.getByRole('switch', { name: 'Unread only' }).getAttribute('aria-checked')).toBe('true');
    await look(page, 'client-notifications-unread');
    await context.close();
  });

  it('4. at phone width the Orders and Reports lists keep the status on screen, a revoked report’s included', async () => {
    const client = await signInAt(browser, 'client', CLIENT_ADMIN);
    const page = client.page;
    await page.setViewportSize(PHONE);
    await page.goto(url('/orders'));
    await listed(page, 'Orders');
    const orderStatus = page.getByRole('table', { name: 'Orders', exact: true }).locator('td.mat-column-status').first();
    await expectOnScreen(page, orderStatus);
    await look(page, 'phone-client-orders');

    await page.goto(url('/reports'));
    await listed(page, 'Reports');
    const row = page.getByRole('row').filter({ hasText: revoked.number! });
    const status = row.locator('td.mat-column-status');
    expect(await status.innerText()).toMatch(/Revoked/);
    await status.scrollIntoViewIfNeeded();
    await expectOnScreen(page, status);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await look(page, 'phone-client-reports');
    await client.context.close();

    const lab = await signInAt(browser, 'lab', LAB_ADMIN);
    await lab.page.setViewportSize(PHONE);
    await lab.page.goto(url(`/lab/reports?q=${SAMPLE}`));
    await listed(lab.page, 'Reports');
    const labStatus = lab.page.getByRole('row').filter({ hasText: revoked.number! }).locator('td.mat-column-status');
    await expectOnScreen(lab.page, labStatus);
    await look(lab.page, 'phone-lab-reports');
    await lab.page.goto(url('/lab/queue'));
    await listed(lab.page, 'Work queue');
    await expectOnScreen(lab.page, lab.page.getByRole('table', { name: 'Work queue', exact: true }).locator('td.mat-column-state').first());
    await look(lab.page, 'phone-lab-queue');
    await lab.context.close();
  });

  it('5. the verification page opened from a QR code shows its result above the fold on a phone', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    page.setDefaultTimeout(60_000);
    await page.goto(url(`/verify?report=${encodeURIComponent(revoked.number!)}&code=${encodeURIComponent(revoked.code!)}`));
    const outcome = page.getByRole('heading', { name: 'Revoked by the issuing lab' });
    await outcome.waitFor();
    await expectOnScreen(page, outcome);
    await look(page, 'phone-verify-revoked');

    await page.goto(url('/verify?report=CAL-2026-999999&code=ABCDEFGHJKMN'));
    const missing = page.getByRole('heading', { name: 'No report with this number and code' });
    await missing.waitFor();
    await expectOnScreen(page, missing);
    await look(page, 'phone-verify-not-found');
    await context.close();
  });

  it('every screen looked at passes the automated accessibility checks, light and dark', () => {
    expect(findings.length === 0 ? '' : describeFindings(findings)).toBe('');
  });
});
