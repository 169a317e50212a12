// One Chromium per test file: Debian's binary, flags that keep it off the network.
import { chromium, type Browser, type Page } from 'playwright-core';
import { join } from 'node:path';
import { ARTIFACTS, BASE_URL } from './stack';

export const DEMO_PASSWORD = 'ohmprint-demo-2026';

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  });
}

export async function screenshot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage: true });
}

export function url(path: string): string {
  return `${BASE_URL}${path}`;
}
