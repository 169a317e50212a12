// Control standards and method validation as an analyst meets them: record a KCl standard run on a
// cell, watch its control chart block the cell and a later run release it, see the measurement
// screen say why before an upload, then open the method-validation screens. Every screen is
// photographed and checked with axe-core (WCAG 2.1 A/AA) in the light and the dark scheme.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { impedance } from '@ohmprint/spectral-engine';
import { accessibilityFindings, describeFindings, settleAnimations, type ScreenFinding } from './support/accessibility';
import { launchBrowser, screenshot, url } from './support/browser';
import { openFromMenu, signInAt } from './support/desk';
import { apiJson } from './support/lab-api';

// Several screens per journey on a shared two-core machine, and a first visit that fits every lot.
jest.setTimeout(600_000);

let browser: Browser;
const findings: ScreenFinding[] = [];
const folder = mkdtempSync(join(tmpdir(), 'ohm-kcl-'));

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** A KCl standard's sweep (R + CPE, 1 kHz–1 MHz) as an instrument export file. */
function kclFile(name: string, resistanceOhm: number): string {
  const f = Float64Array.from({ length: 31 }, (_, i) => 1e3 * 1000 ** (i / 30));
  const z = impedance('r-cpe', { r: resistanceOhm, q: 2e-5, n: 0.88 }, f);
  const path = join(folder, name);
  writeFileSync(path, ['Freq / Hz;Zre / Ohm;-Zim / Ohm', ...Array.from(f, (v, i) => `${v};${z.re[i]};${-z.im[i]}`)].join('\n'));
  return path;
}

async function look(page: Page, name: string): Promise<void> {
  await page.waitForLoadState('networkidle');
  // a confirmation snack bar (4 s) caught mid-animation reads as a contrast and aria-hidden failure
  await page.locator('mat-snack-bar-container').waitFor({ state: 'detached', timeout: 15_000 });
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await settleAnimations(page);
    findings.push(...(await accessibilityFindings(page, `${name} (${scheme})`)));
    await screenshot(page, `validation-${name}-${scheme}`);
  }
  await page.emulateMedia({ colorScheme: 'light' });
}

async function recordRun(page: Page, file: string): Promise<void> {
  await page.getByLabel('Temperature of the standard').fill('25');
  await page.locator('input[type=file]').setInputFiles(file);
  await page.getByRole('button', { name: 'Record run' }).click();
  await page.getByText(/Run recorded: K =/).first().waitFor();
}

describe('control standards and method validation', () => {
  it('an analyst records standard runs, a drift blocks the cell, the measurement screen says why, a good run releases it', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'analyst@calder.test');
    await openFromMenu(page, 'Instruments and cells');
    await page.getByRole('table', { name: 'Measurement cells' }).getByRole('row').nth(2).waitFor();
    await look(page, 'bench');

    await page.getByRole('link', { name: 'Dip cell B (demo)' }).click();
    await page.getByRole('img', { name: /Control chart of Dip cell B/ }).waitFor();
    await expect(page.getByText('In control', { exact: true }).first().isVisible()).resolves.toBe(true);
    await look(page, 'cell-chart');

    // 0.01 mol/kg KCl at 25 °C (1408.23 µS/cm): R = 714 Ω gives K ≈ 1.0055 cm⁻¹, far above the demo cell's limits.
    await recordRun(page, kclFile('kcl-drift.csv', 714));
    await page.getByText('Out of control: blocked').first().waitFor();
    await look(page, 'cell-blocked');

    await openFromMenu(page, 'Work queue');
    await page.getByLabel('Search by code, product or client').fill('OP-7K3M-Q9');
    await page.getByRole('link', { name: 'OP-7K3M-Q9' }).click();
    // a select with no options yet does not open, so wait for the bench list as a person waits for the page
    const bench = page.waitForResponse((r) => r.url().endsWith('/api/lab/bench') && r.ok());
    await page.getByRole('tab', { name: 'Measurements' }).click();
    await bench;
    await page.getByRole('combobox', { name: 'Cell' }).click();
    await page.getByRole('option', { name: /Dip cell B/ }).click();
    await page.getByRole('alert').filter({ hasText: 'Dip cell B (demo) is out of control' }).waitFor();
    await look(page, 'measurement-blocked');

    await page.getByRole('link', { name: 'Open its control chart' }).click();
    await page.getByRole('img', { name: /Control chart of Dip cell B/ }).waitFor();
    await recordRun(page, kclFile('kcl-good.csv', 709.9));
    await page.getByText('In control', { exact: true }).first().waitFor();
    await look(page, 'cell-released');
    await context.close();
  });

  it('a reviewer opens the method-validation screens', async () => {
    // The demo's Ridgeline Red library, opened by its link (other journeys on this stack publish
    // larger libraries of their own, and the page opens the first version it lists).
    const libraries = await apiJson<{ items: Array<{ product: { name: string }; versions: Array<{ id: string; version: number; status: string }> }> }>('reviewer@calder.test', '/api/lab/libraries?pageSize=100');
    const ridgeline = libraries.items.find((l) => l.product.name === 'Ridgeline Red (demo)')!.versions.filter((v) => v.status === 'published').sort((a, b) => b.version - a.version)[0];
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await page.goto(url(`/lab/validation?version=${ridgeline.id}`));
    await page.getByRole('combobox', { name: 'Library version' }).filter({ hasText: `Ridgeline Red (demo) (Hollin Ridge Cellars) · version ${ridgeline.version}` }).waitFor();
    // the first visit fits every lot of the version (then cached): give a busy machine time
    await page.getByRole('table', { name: 'Correlation of fitted parameters with chemistry' }).waitFor({ timeout: 180_000 });
    await page.getByRole('figure').waitFor();
    await look(page, 'correlation');
    await page.getByRole('tab', { name: 'Repeatability' }).click();
    await page.getByRole('img', { name: /^Histogram/ }).waitFor();
    await look(page, 'repeatability');
    await page.getByRole('tab', { name: 'Detection study' }).click();
    await page.getByText(/A level is reliably detected when at least 95 %/).waitFor();
    await look(page, 'detection');
    await page.getByRole('tab', { name: 'Blind checks' }).click();
    await page.getByText('Blind checks with a verdict').waitFor();
    await look(page, 'blind-checks');
    await context.close();
  });

  it('breaks no automated accessibility rule on these screens, light or dark', () => {
    expect(describeFindings(findings)).toBe('');
  });
});
