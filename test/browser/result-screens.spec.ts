// The analysis and review screens as an analyst and a reviewer read them: the fitted model drawn
// over the measured spectrum with its residuals, the weighting beside χ², typicality explained,
// the map axes' share of spread, the producer's lot code and the claimed-lot check, the engine
// version in the details; chart labels laid out without overlap or clipping. Photographed and
// checked with axe-core in the light and the dark scheme.
import type { Browser, Page } from 'playwright-core';
import { accessibilityFindings, describeFindings, type ScreenFinding } from './support/accessibility';
import { launchBrowser, screenshot, url } from './support/browser';
import { signInAt } from './support/desk';
import { apiAs as api, measureAndAnalyse } from './support/lab-api';

/**
 * A seeded Ridgeline Red check, watered by 12 %: far outside the library, so T95 and T99 crowd the
 * left of the histogram; the client claimed the producer's lot L24-118.
 */
const SAMPLE = 'OP-9RWD-6F';

jest.setTimeout(240_000);

let browser: Browser;
const findings: ScreenFinding[] = [];
const handOn: { analysisId?: string; sampleId?: string } = {};

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** axe in both schemes, and a photograph of each, for the screen as it is now (`busy`: while it shows work in progress). */
async function look(page: Page, name: string, busy = false): Promise<void> {
  if (!busy) {
    await page.waitForLoadState('networkidle');
    await page.waitForFunction(() => !document.querySelector('mat-progress-bar[mode="indeterminate"]'));
  }
  const size = page.viewportSize() ?? { width: 1280, height: 900 };
  const tallest = await page.evaluate(() => Math.max(...Array.from(document.querySelectorAll('*'), (e) => (e.scrollHeight > e.clientHeight + 1 ? e.scrollHeight : 0)), 0));
  await page.setViewportSize({ width: size.width, height: Math.min(6000, Math.max(size.height, tallest + 80)) });
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    findings.push(...(await accessibilityFindings(page, `${name} (${scheme})`)));
    await screenshot(page, `result-screens-${name}-${scheme}`);
  }
  await page.emulateMedia({ colorScheme: 'light' });
  await page.setViewportSize(size);
}

interface Box {
  label: string;
  x: number;
  y: number;
  width: number;
  height: number;
}

/** The drawn boxes of a chart's labels, in the chart's own units, and the chart's viewBox. */
async function labelBoxes(page: Page, chart: string): Promise<{ boxes: Box[]; view: { width: number; height: number } }> {
  return page.locator(`${chart} svg[role="img"]`).evaluate((svg: SVGSVGElement) => ({
    boxes: Array.from(svg.querySelectorAll<SVGTextElement>('text[data-label]'), (t) => {
      const b = t.getBBox();
      return { label: t.textContent?.trim() ?? '', x: b.x, y: b.y, width: b.width, height: b.height };
    }),
    view: { width: svg.viewBox.baseVal.width, height: svg.viewBox.baseVal.height },
  }));
}

function expectApartAndInside({ boxes, view }: { boxes: Box[]; view: { width: number; height: number } }): void {
  for (const b of boxes) {
    expect({ label: b.label, left: b.x >= 0, right: b.x + b.width <= view.width, top: b.y >= 0 }).toEqual({ label: b.label, left: true, right: true, top: true });
  }
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const [a, b] = [boxes[i], boxes[j]];
      const overlap = a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
      expect({ pair: `${a.label} / ${b.label}`, overlap }).toEqual({ pair: `${a.label} / ${b.label}`, overlap: false });
    }
  }
}

/** The rows of the lot-distance table as shown: rank, lot code and distance. */
async function lotRows(page: Page): Promise<Array<{ rank: number; lot: string; distance: number }>> {
  const rows = await page.locator('ohm-lot-distance-pager tbody tr').evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll('td'), (td) => td.textContent?.trim() ?? '')));
  return rows.map(([rank, lot, distance]) => ({ rank: Number(rank), lot, distance: Number(distance.replace(/,/g, '')) }));
}

/** What both screens show, checked the same way on each. */
async function checkResult(page: Page): Promise<void> {
  // the fitted model over the data in both plots, and its residuals
  const bode = page.locator('ohm-analysis-result ohm-bode-chart');
  await bode.locator('ohm-chart-legend li').filter({ hasText: /Fitted .* model/ }).waitFor();
  expect(await bode.locator('path.series').count()).toBe(4);
  expect(await page.locator('ohm-analysis-result ohm-nyquist-chart ohm-chart-legend li').filter({ hasText: /Fitted .* model/ }).count()).toBe(1);
  const residuals = page.locator('ohm-fit-residual-chart');
  await residuals.getByText('Fit residuals: measured minus fitted, in % of |Z|').waitFor();
  const paths = await residuals.locator('path.residual').evaluateAll((ps) => ps.map((p) => p.getAttribute('d') ?? ''));
  expect(paths).toHaveLength(2);
  for (const d of paths) expect(d.length).toBeGreaterThan(20);
  // the weighting beside χ²
  expect(await page.getByTestId('fit-summary').innerText()).toMatch(/χ² [^(]*\S \(modulus weighting\)/);
  // typicality explained, map axes with their share of spread
  expect(await page.getByTestId('typicality-text').innerText()).toMatch(/of the library's calibration distances are larger than the sample's/);
  expect(await page.locator('ohm-library-map').innerText()).toMatch(/Map axis 1 \(\d+ % of spread\)/);
  // the engine version is a detail, not a headline figure
  expect(await page.locator('.headline').innerText()).not.toMatch(/Engine/);
  expect(await page.getByTestId('engine-version').innerText()).toMatch(/\d+\.\d+/);
  // the producer's lot code beside ours, and the claimed-lot check
  expect(await page.getByTestId('nearest-lot').innerText()).toMatch(/RID-L\d{4}\s+producer's lot L24-1\d\d/);
  expect(await page.getByTestId('claimed-lot').innerText()).toMatch(/The client claimed the producer's lot L24-118; the nearest lot RID-L\d{4} is (not )?that lot/);
  // labels: none overlapping, none outside the chart
  const histogram = await labelBoxes(page, 'ohm-analysis-result ohm-distance-histogram');
  expect(histogram.boxes.map((b) => b.label.split(' ')[0]).sort()).toEqual(['Sample', 'T95', 'T99']);
  expectApartAndInside(histogram);
  const nyquist = await labelBoxes(page, 'ohm-analysis-result ohm-nyquist-chart');
  expect(nyquist.boxes.length).toBeGreaterThanOrEqual(2);
  expectApartAndInside(nyquist);
  const map = await labelBoxes(page, 'ohm-analysis-result ohm-library-map');
  expect(map.boxes.length).toBeGreaterThanOrEqual(3);
  expectApartAndInside(map);
}

describe('result screens', () => {
  it('the analyst reads the analysis: fit over data, residuals, weighting, typicality, lots', async () => {
    Object.assign(handOn, await measureAndAnalyse(SAMPLE));
    const { context, page } = await signInAt(browser, 'lab', 'analyst@calder.test');
    await page.goto(url(`/lab/samples/${handOn.sampleId}`));
    await page.getByRole('tab', { name: 'Analysis' }).click();
    await page.getByRole('status').filter({ hasText: 'Not consistent' }).first().waitFor();
    await checkResult(page);
    await look(page, 'analysis');

    // every lot's distance, fifty at a time and only when asked: 80 lots in the demo library
    await page.getByRole('button', { name: 'Show every lot’s distance (80 lots, 50 a page)' }).click();
    const lots = page.locator('ohm-lot-distance-pager table');
    await lots.locator('caption', { hasText: 'Lots 1–50 of 80, nearest first' }).waitFor();
    const firstPage = await lotRows(page);
    expect(firstPage.map((r) => r.rank)).toEqual(Array.from({ length: 50 }, (_, i) => i + 1));
    expect(firstPage.map((r) => r.distance)).toEqual([...firstPage.map((r) => r.distance)].sort((a, b) => a - b));
    expect(await page.getByTestId('nearest-lot').innerText()).toContain(firstPage[0].lot);
    await look(page, 'analysis-lot-distances');
    await page.getByRole('button', { name: 'Next 50' }).click();
    await lots.locator('caption', { hasText: 'Lots 51–80 of 80, nearest first' }).waitFor();
    const secondPage = await lotRows(page);
    expect(secondPage.map((r) => r.rank)).toEqual(Array.from({ length: 30 }, (_, i) => i + 51));
    expect(secondPage[0].distance).toBeGreaterThanOrEqual(firstPage[49].distance);
    expect(await page.getByRole('button', { name: 'Next 50' }).isDisabled()).toBe(true);
    await page.getByRole('button', { name: 'Previous 50' }).click();
    await lots.locator('caption', { hasText: 'Lots 1–50 of 80, nearest first' }).waitFor();
    await context.close();
  });

  it('the reviewer sees the same on the review page', async () => {
    const json = { 'content-type': 'application/json' };
    const submitted = await api('analyst@calder.test', `/api/lab/analyses/${handOn.analysisId}/submit`, { method: 'POST', headers: json, body: '{}' });
    expect(submitted.status).toBe(200);
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    await page.goto(url(`/lab/reviews/${handOn.analysisId}`));
    await checkResult(page);
    await look(page, 'review');
    await context.close();
  });

  it('the reviewer approves: the page says the report is being issued, then that it is issued', async () => {
    const { context, page } = await signInAt(browser, 'lab', 'reviewer@calder.test');
    // The issuance status is held at "issuing" until the waiting state has been read and checked;
    // then the real answers come through.
    let hold = true;
    await page.route('**/api/lab/analyses/*/issuance', (route) =>
      hold ? route.fulfill({ json: { analysisId: handOn.analysisId, state: 'issuing', report: null, detail: null } }) : route.fallback(),
    );
    await page.goto(url(`/lab/reviews/${handOn.analysisId}`));
    await page.getByRole('button', { name: 'Approve and issue the report' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Approve and issue' }).click();
    await page.getByRole('status').filter({ hasText: 'Issuing report…' }).waitFor();
    await look(page, 'issuing', true);
    hold = false;
    await page.getByText(/Report [A-Z]{2,4}-\d{4}-\d{6} issued, signed and sent to the client\./).waitFor({ timeout: 60_000 });
    await context.close();
  });

  it('breaks no automated accessibility rule on these screens, light or dark', () => {
    expect(describeFindings(findings)).toBe('');
  });
});
