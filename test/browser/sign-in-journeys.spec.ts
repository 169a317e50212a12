// Every demo role signs into its portal in a real browser and lands on its home screen.
import type { Browser } from 'playwright-core';
import { DEMO_PASSWORD, launchBrowser, screenshot, url } from './support/browser';

interface Account {
  role: string;
  email: string;
  portal: 'lab' | 'client';
  organisation: string | null;
}

const ACCOUNTS: Account[] = [
  { role: 'platform-operator', email: 'operator@ohmprint.test', portal: 'lab', organisation: null },
  { role: 'lab-admin', email: 'admin@calder.test', portal: 'lab', organisation: 'Calder Analytical' },
  { role: 'intake-technician', email: 'intake@calder.test', portal: 'lab', organisation: 'Calder Analytical' },
  { role: 'analyst', email: 'analyst@calder.test', portal: 'lab', organisation: 'Calder Analytical' },
  { role: 'reviewer', email: 'reviewer@calder.test', portal: 'lab', organisation: 'Calder Analytical' },
  { role: 'client-admin', email: 'admin@hollinridge.test', portal: 'client', organisation: 'Hollin Ridge Cellars' },
  { role: 'client-member', email: 'member@hollinridge.test', portal: 'client', organisation: 'Hollin Ridge Cellars' },
  { role: 'client-admin', email: 'admin@brightwater.test', portal: 'client', organisation: 'Brightwater Dairy Cooperative' },
  { role: 'client-member', email: 'member@sunvale.test', portal: 'client', organisation: 'Sunvale Juice Works' },
];

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('signing in as each demo role', () => {
  for (const account of ACCOUNTS) {
    it(`${account.role} ${account.email} lands on the ${account.portal} portal's home screen`, async () => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      const base = account.portal === 'lab' ? '/lab/' : '/';
      await page.goto(url(base));
      await page.waitForURL(/sign-in/);
      await page.getByLabel('E-mail').fill(account.email);
      await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('button', { name: /^Account menu for / }).waitFor();
      expect(new URL(page.url()).pathname).toBe(base);
      if (account.organisation) {
        await page.locator('mat-toolbar').getByText(account.organisation).first().waitFor();
        expect(await page.locator('mat-toolbar').innerText()).toContain(account.organisation);
      }
      await screenshot(page, `home-${account.portal}-${account.email.replace(/[@.]/g, '-')}`);
      await context.close();
    });
  }

  it('a producer signing into the lab portal is pointed to the client portal', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(url('/lab/sign-in'));
    await page.getByLabel('E-mail').fill('admin@hollinridge.test');
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('This account belongs to the client portal').waitFor();
    await screenshot(page, 'lab-sign-in-wrong-portal');
    await context.close();
  });

  it('a wrong password is refused with a message and no session', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(url('/sign-in'));
    await page.getByLabel('E-mail').fill('admin@sunvale.test');
    await page.getByLabel('Password', { exact: true }).fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.locator('ohm-notice').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await context.close();
  });
});
