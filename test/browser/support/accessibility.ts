// Automated WCAG 2.1 A/AA checks with axe-core, run inside the page the person is looking at.
// They catch what a machine can (names, labels, contrast, landmarks, ARIA misuse); they do not
// replace trying a screen with the keyboard and a screen reader.
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

// Evaluated through the DevTools protocol rather than added as a <script>: the portals' CSP
// rightly refuses inline scripts.
const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

export interface ScreenFinding {
  screen: string;
  rule: string;
  impact: string;
  help: string;
  targets: string[];
  /** axe's own account of the first failing element, e.g. the measured contrast ratio. */
  detail: string;
}

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[]; failureSummary?: string }[] }[];
}

/** Every violation on the screen as it is now, one line each, ready to print in a failure. */
export async function accessibilityFindings(page: Page, screen: string): Promise<ScreenFinding[]> {
  // colours caught mid-transition (a scheme switch, a label floating up) would be misjudged
  await settleAnimations(page);
  const hasAxe = await page.evaluate(() => 'axe' in window);
  if (!hasAxe) await page.evaluate(AXE_SOURCE);
  const result = (await page.evaluate(
    (tags) => (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<unknown> } }).axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] }),
    TAGS,
  )) as AxeResult;
  return result.violations.map((v) => ({
    screen,
    rule: v.id,
    impact: v.impact ?? 'unknown',
    help: v.help,
    targets: v.nodes.slice(0, 5).map((n) => n.target.map(String).join(' ')),
    detail: (v.nodes[0]?.failureSummary ?? '').replace(/\s+/g, ' ').trim(),
  }));
}

/** Waits for running animations and transitions to end; endless ones (a progress bar's) are left running. */
export async function settleAnimations(page: Page): Promise<void> {
  await page.evaluate(() =>
    Promise.all(
      document
        .getAnimations()
        .filter((a) => a.effect?.getComputedTiming().iterations !== Infinity)
        .map((a) => a.finished.catch(() => undefined)),
    ),
  );
}

export function describeFindings(findings: readonly ScreenFinding[]): string {
  return findings.map((f) => `${f.screen}: [${f.impact}] ${f.rule}, ${f.help}: ${f.targets.join(' | ')} (${f.detail})`).join('\n');
}
