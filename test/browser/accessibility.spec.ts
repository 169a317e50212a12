// The screens the whole-loop journey does not pass through, checked with axe-core (WCAG 2.1 A and
// AA) in the light and the dark scheme, as each role sees them with the seeded demo data.
// Read-only: it signs in and looks, so it can run beside the journey on the same stack.
import type { Browser, Page } from 'playwright-core';
import { accessibilityFindings, describeFindings, type ScreenFinding } from './support/accessibility';
import { launchBrowser, screenshot, url } from './support/browser';
import { signInAt } from './support/desk';

interface Screen {
  name: string;
  path: string;
  /** What shows that the screen has its data, beyond the page heading. */
  ready?: (page: Page) => Promise<unknown>;
}

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function settled(page: Page): Promise<void> {
  await page.getByRole('heading', { level: 1 }).first().waitFor();
  await page.waitForLoadState('networkidle');
  await page.waitForFunction(() => !document.querySelector('mat-progress-bar[mode="indeterminate"]'));
}

/** Each screen as it is in the light scheme and in the dark one. */
async function check(page: Page, screens: readonly Screen[]): Promise<ScreenFinding[]> {
  const findings: ScreenFinding[] = [];
  for (const screen of screens) {
    await page.goto(url(screen.path));
    await settled(page);
    await screen.ready?.(page);
    for (const scheme of ['light', 'dark'] as const) {
      await page.emulateMedia({ colorScheme: scheme });
      findings.push(...(await accessibilityFindings(page, `${screen.name} (${scheme})`)));
    }
    await screenshot(page, `a11y-${screen.name}-dark`);
    await page.emulateMedia({ colorScheme: 'light' });
  }
  return findings;
}

/** Signs in as one person and checks their screens; the findings, for one assertion per test. */
async function checkAs(portal: 'lab' | 'client', email: string, screens: readonly Screen[]): Promise<ScreenFinding[]> {
  const { context, page } = await signInAt(browser, portal, email);
  const findings = await check(page, screens);
  await context.close();
  return findings;
}

const table = (name: string) => (page: Page) => page.getByRole('table', { name, exact: true }).getByRole('row').nth(1).waitFor();

describe('automated accessibility checks in both colour schemes', () => {
  it('the public pages: sign-in to both portals, password reset and report verification', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    page.setDefaultTimeout(60_000);
    const findings = await check(page, [
      { name: 'client-sign-in', path: '/sign-in' },
      { name: 'lab-sign-in', path: '/lab/sign-in' },
      { name: 'forgot-password', path: '/forgot-password' },
      { name: 'verify', path: '/verify' },
    ]);
    await context.close();
    expect(describeFindings(findings)).toBe('');
  });

  it('the lab admin’s screens', async () => {
    const findings = await checkAs('lab', 'admin@calder.test', [
      { name: 'lab-home-admin', path: '/lab/' },
      { name: 'lab-staff', path: '/lab/staff', ready: table('Staff') },
      { name: 'lab-clients', path: '/lab/clients' },
      { name: 'lab-instrument-keys', path: '/lab/instrument-keys' },
      { name: 'lab-intake-limits', path: '/lab/intake-limits', ready: async (page) => page.getByRole('row', { name: /Milk/ }).waitFor() },
      { name: 'lab-queue', path: '/lab/queue', ready: table('Work queue') },
      { name: 'lab-reports', path: '/lab/reports' },
      { name: 'lab-profile', path: '/lab/profile' },
      { name: 'lab-not-found', path: '/lab/no-such-screen' },
    ]);
    expect(describeFindings(findings)).toBe('');
  });

  it('the platform operator’s list of labs', async () => {
    const findings = await checkAs('lab', 'operator@ohmprint.test', [{ name: 'operator-labs', path: '/lab/labs', ready: table('Labs') }]);
    expect(describeFindings(findings)).toBe('');
  });

  it('the intake bench with a received parcel looked up, and the reviewer’s queue', async () => {
    const findings = await checkAs('lab', 'intake@calder.test', [
      {
        name: 'lab-intake-received',
        path: '/lab/intake',
        ready: async (page) => {
          const code = page.getByLabel('Sample code');
          await code.fill('OP-1PYF-9C');
          await code.press('Enter');
          await page.getByRole('button', { name: 'Accept and store' }).waitFor();
        },
      },
    ]);
    findings.push(...(await checkAs('lab', 'reviewer@calder.test', [{ name: 'lab-reviews', path: '/lab/reviews' }])));
    expect(describeFindings(findings)).toBe('');
  });

  it('the client admin’s screens', async () => {
    const findings = await checkAs('client', 'admin@hollinridge.test', [
      { name: 'client-home', path: '/' },
      { name: 'client-team', path: '/team' },
      { name: 'client-orders', path: '/orders', ready: table('Orders') },
      { name: 'client-reports', path: '/reports' },
      { name: 'client-profile', path: '/profile' },
    ]);
    expect(describeFindings(findings)).toBe('');
  });
});
