import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

// Accessibility check with axe-core (Deque's WCAG rule engine), run inside the page.
const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/**
 * Runs axe-core's WCAG 2.x A and AA rules on the current page and returns the violations
 * of impact "serious" or "critical" (screens.md: axe-core finds no serious issue).
 */
export async function seriousAxeViolations(page: Page): Promise<AxeViolation[]> {
  // evaluated through the devtools protocol, not as an inline <script>: our CSP (script-src 'self')
  // refuses inline scripts, and the refusal would itself be a console error
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(`${axeSource}\n;void 0`);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[] }[] }[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.map((n) => n.target.map(String).join(' ')) }));
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}
