/** Runs axe-core inside a page and reports what it finds. */
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const require = createRequire(import.meta.url);
const axeScript = require.resolve('axe-core/axe.min.js');

/** One axe rule broken on the page, cut down to what a failing assertion should print. */
export interface AccessibilityViolation {
  readonly id: string;
  readonly impact: string | null;
  readonly help: string;
  readonly targets: string[];
}

/** The rule sets we hold the product to: WCAG 2.0–2.2 levels A and AA, plus axe's best practices. */
const ruleTags = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'];

/** Same-origin address the test answers with axe-core's file, so the app's CSP (script-src 'self') stays on. */
const axeAddress = '/__browser-test__/axe.min.js';

/**
 * Injects axe-core from node_modules (no CDN) and returns every violation on the current page.
 * `addScriptTag({ path })` would inline the script, which the API's strict CSP rightly blocks, and
 * bypassing the CSP would hide the very failures these tests exist to catch; so the script tag
 * loads a same-origin address that the browser context fulfils from the file.
 */
export async function findAccessibilityViolations(page: Page): Promise<AccessibilityViolation[]> {
  await page.context().route(`**${axeAddress}`, (route) => route.fulfill({ path: axeScript, contentType: 'text/javascript' }));
  await page.addScriptTag({ url: axeAddress });
  return page.evaluate(async (tags) => {
    type AxeResult = { violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[] }[] }[] };
    const axe = (window as unknown as { axe: { run(context: Document, options: object): Promise<AxeResult> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return result.violations.map((violation) => ({
      id: violation.id,
      impact: violation.impact,
      help: violation.help,
      targets: violation.nodes.map((node) => node.target.join(' ')),
    }));
  }, ruleTags);
}

/** Only the violations that block people: axe's "serious" and "critical" impacts. */
export function blockingViolations(violations: readonly AccessibilityViolation[]): AccessibilityViolation[] {
  return violations.filter((violation) => violation.impact === 'serious' || violation.impact === 'critical');
}
