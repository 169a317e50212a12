// A person signs into their portal in a fresh browser context of their own, as they would at their desk.
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { accessibilityFindings, settleAnimations, type ScreenFinding } from './accessibility';
import { DEMO_PASSWORD, screenshot, url } from './browser';

export interface Desk {
  context: BrowserContext;
  page: Page;
}

/** Generous waits: the journey shares two cores with builds and other test runs. */
const WAIT_MS = 60_000;

export async function signInAt(browser: Browser, portal: 'lab' | 'client', email: string): Promise<Desk> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
  const page = await context.newPage();
  page.setDefaultTimeout(WAIT_MS);
  await page.goto(url(portal === 'lab' ? '/lab/sign-in' : '/sign-in'));
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: /^Account menu for / }).waitFor();
  return { context, page };
}

/** The access token a direct API request needs, from a real sign-in. */
export async function accessTokenFor(email: string): Promise<string> {
  const res = await fetch(url('/api/auth/sign-in'), {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (!res.ok) throw new Error(`Sign-in of ${email} answered ${res.status}: ${await res.text()}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}

/** Opens a screen from the side navigation (home screens repeat some entries as shortcuts). */
export async function openFromMenu(page: Page, label: string): Promise<void> {
  const link = page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: label, exact: true });
  await link.click();
  // the menu marks the entry once the router has swapped the screen, so the old one is gone
  await page.waitForFunction((el) => el?.getAttribute('aria-current') === 'page', await link.elementHandle());
}

const checked = { screens: [] as string[], findings: [] as ScreenFinding[] };

/** The screens photographed so far, and what the automated accessibility checks found on them. */
export function accessibilitySoFar(): { readonly screens: readonly string[]; readonly findings: readonly ScreenFinding[] } {
  return checked;
}

/**
 * The portals scroll inside the shell, not the document, so a full-page capture stops at the
 * window: grow the window to the tallest scrolling area for the picture, then put it back.
 */
export async function screenshotWhole(page: Page, name: string): Promise<void> {
  const size = page.viewportSize() ?? { width: 1280, height: 900 };
  const tallest = await page.evaluate(() => Math.max(...Array.from(document.querySelectorAll('*'), (e) => (e.scrollHeight > e.clientHeight + 1 ? e.scrollHeight : 0)), document.documentElement.scrollHeight));
  await page.setViewportSize({ width: size.width, height: Math.min(6000, Math.max(size.height, tallest + 80)) });
  // a dialog or snack bar still fading in would be caught half transparent
  await settleAnimations(page);
  // a snack bar keeps its message aria-hidden for a moment, until it has been handed to the live region
  await page.waitForFunction(() => !document.querySelector('.mat-mdc-snack-bar-label > [aria-hidden="true"]'), null, { timeout: 5_000 });
  checked.screens.push(name);
  checked.findings.push(...(await accessibilityFindings(page, name)));
  await screenshot(page, name);
  await page.setViewportSize(size);
}
