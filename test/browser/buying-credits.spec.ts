// A producer's admin buys a credit pack on the local test checkout page and sees the credits and the
// ledger move; a lab admin edits a pack, refunds a payment and adjusts a balance. Every new screen
// is checked with axe-core in the light and the dark scheme and photographed.
import type { Browser, Page } from 'playwright-core';
import { accessibilityFindings, describeFindings, type ScreenFinding } from './support/accessibility';
import { launchBrowser, screenshot } from './support/browser';
import { openFromMenu, signInAt, type Desk } from './support/desk';

jest.setTimeout(240_000);

let browser: Browser;
const findings: ScreenFinding[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function settled(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle');
  await page.waitForFunction(() => !document.querySelector('mat-progress-bar[mode="indeterminate"]'));
}

/** axe in both schemes, and a picture of each. */
async function look(page: Page, name: string): Promise<void> {
  await settled(page);
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    findings.push(...(await accessibilityFindings(page, `${name} (${scheme})`)));
    await screenshot(page, `credits-${name}-${scheme}`);
  }
  await page.emulateMedia({ colorScheme: 'light' });
}

const availableOn = async (page: Page): Promise<number> => Number(await page.getByTestId('credits-available').first().textContent());

describe('buying credits', () => {
  let client: Desk;
  let before = 0;

  afterAll(async () => {
    await client?.context.close();
  });

  it('the client admin sees the balance on the home page and the packs on sale', async () => {
    client = await signInAt(browser, 'client', 'admin@brightwater.test');
    const { page } = client;
    await page.getByRole('heading', { name: 'Test credits' }).waitFor();
    before = await availableOn(page);
    expect(before).toBeGreaterThan(0); // the demo gives each producer a small balance
    await look(page, 'client-home');
    await page.getByRole('link', { name: 'Buy credits' }).click();
    await page.getByRole('heading', { name: 'Buy a credit pack' }).waitFor();
    await page.getByRole('heading', { name: 'Ten checks (demo)' }).waitFor();
    await expect(page.getByText('Launch offer (demo, retired)').count()).resolves.toBe(0);
    await look(page, 'client-packs');
  });

  it('pays on the test checkout page after a declined card, comes back and sees the credits added', async () => {
    const { page } = client;
    await page.getByRole('button', { name: /^Buy Ten checks \(demo\) for/ }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    await page.getByText('Local test checkout: no real money moves').waitFor();
    await look(page, 'test-checkout');
    await page.getByRole('button', { name: 'Decline' }).click();
    await page.getByRole('alert').filter({ hasText: 'The test card was declined' }).waitFor();
    await screenshot(page, 'credits-test-checkout-declined');
    await page.getByRole('button', { name: /^Pay / }).click();
    await page.waitForURL(/\/credits\/bought\?checkout=cs_test_/);
    await page.getByText(/10 credits from “Ten checks \(demo\)” were added/).waitFor();
    await expect(page.getByText(`You now have ${before + 10} credits available`).count()).resolves.toBe(1);
    await look(page, 'client-bought');
  });

  it('the ledger and the payments show the purchase, its state in words and its receipt', async () => {
    const { page } = client;
    await page.getByRole('link', { name: 'Ledger' }).first().click();
    const ledger = page.getByRole('table', { name: 'Credit ledger' });
    await ledger.getByRole('row').nth(1).waitFor();
    const newest = ledger.getByRole('row').nth(1);
    await expect(newest.textContent()).resolves.toMatch(new RegExp(`Bought\\+10 available.*Bought Ten checks \\(demo\\)Payment R-\\d{6}.*${before + 10} available`, 's'));
    await look(page, 'client-ledger');

    await page.getByRole('tab', { name: 'Payments' }).click();
    const payments = page.getByRole('table', { name: 'Payments' });
    await payments.getByRole('row').nth(1).waitFor();
    await expect(payments.getByRole('row').nth(1).textContent()).resolves.toMatch(/Ten checks \(demo\).*Paid.*credits were added/s);
    await expect(payments.getByText('Not completed').count()).resolves.toBeGreaterThan(0); // the demo's abandoned checkout
    await look(page, 'client-payments');
    await payments.getByRole('row').nth(1).getByRole('button', { name: /^Receipt R-/ }).click();
    await page.getByRole('dialog').getByText('Ten checks (demo): 10 test credits').waitFor();
    await look(page, 'client-receipt');
    await page.getByRole('button', { name: 'Close' }).click();
  });

  it('going back from the test checkout page without paying takes no money and says so', async () => {
    const { page } = client;
    await page.getByRole('tab', { name: 'Balance and packs' }).click();
    await page.getByRole('button', { name: /^Buy Single check \(demo\) for/ }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    await page.getByRole('link', { name: 'Back without paying' }).click();
    await page.waitForURL(/\/credits\/not-bought/);
    await page.getByText(/Not completed: The checkout was left without paying; no money was taken and no credits were added/).waitFor();
    await look(page, 'client-not-bought');
    await page.getByRole('link', { name: 'Back to credits' }).click();
    await expect(availableOn(page)).resolves.toBe(before + 10);
  });
});

describe('the lab admin’s billing', () => {
  let lab: Desk;

  afterAll(async () => {
    await lab?.context.close();
  });

  it('edits a pack: a new price at the payment service, shown in the list', async () => {
    lab = await signInAt(browser, 'lab', 'admin@calder.test');
    const { page } = lab;
    await openFromMenu(page, 'Billing');
    const packs = page.getByRole('table', { name: 'Credit packs' });
    await packs.getByRole('row').nth(1).waitFor();
    await look(page, 'lab-prices-packs');
    await page.getByRole('button', { name: 'Edit Single check (demo)' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Price').fill('52.00');
    await look(page, 'lab-pack-dialog');
    await dialog.getByRole('button', { name: 'Save changes' }).click();
    await dialog.waitFor({ state: 'detached' });
    // the list reloads after the dialog closes: wait for the new price, then read the whole row
    const row = packs.getByRole('row').filter({ hasText: 'Single check (demo)' }).filter({ hasText: '€52.00' });
    await row.waitFor();
    await expect(row.textContent()).resolves.toMatch(/€52\.00.*On sale.*price_/s);
  });

  it('refunds the payment just made (its credits are unused), with a confirmation', async () => {
    const { page } = lab;
    await page.getByRole('tab', { name: 'Payments' }).click();
    const payments = page.getByRole('table', { name: 'Payments' });
    await payments.getByRole('row').nth(1).waitFor();
    await look(page, 'lab-payments');
    const row = payments.getByRole('row').filter({ hasText: 'Brightwater' }).filter({ hasText: 'Paid: credits added' }).first();
    await row.getByRole('button', { name: /^Refund R-/ }).click();
    await page.getByRole('dialog').getByText(/10 credits leave their balance/).waitFor();
    await look(page, 'lab-refund-confirm');
    await page.getByRole('dialog').getByRole('button', { name: 'Refund' }).click();
    await page.getByText(/was refunded; 10 credits were removed/).waitFor();
  });

  it('adjusts a balance by hand with a reason', async () => {
    const { page } = lab;
    await page.getByRole('tab', { name: 'Adjustments' }).click();
    const table = page.getByRole('table', { name: 'Client credits' });
    await table.getByRole('row').nth(1).waitFor();
    await look(page, 'lab-adjustments');
    await page.getByRole('button', { name: 'Adjust credits of Brightwater Dairy Cooperative' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Change in credits').fill('2');
    await dialog.getByRole('button', { name: 'Adjust credits' }).click();
    await dialog.getByText('Say why, in at least 5 characters.').waitFor();
    await dialog.getByLabel('Reason').fill('Goodwill for a delayed report (demo)');
    await look(page, 'lab-adjust-dialog');
    await dialog.getByRole('button', { name: 'Adjust credits' }).click();
    await page.getByText(/Brightwater Dairy Cooperative now has \d+ credits available/).waitFor();
  });

  it('no new screen breaks the automated accessibility checks, light or dark', () => {
    expect(describeFindings(findings)).toBe('');
  });
});
