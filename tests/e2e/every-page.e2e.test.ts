import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { seriousAxeViolations } from './helpers/axe';
import { screenshot, signIn, useBrowser, type DemoRole } from './helpers/browser';

// Issue 16 (Done when): every page of every role, and the signed-out pages, in Chromium:
// axe-core (Deque's WCAG 2.x A/AA rules) finds no serious or critical issue, and the browser's
// console shows no error (a failed request, an uncaught exception, a CSP report). "Every page"
// is the role's main navigation and one detail page of each kind linked from those pages
// (a stock tiling, a puzzle, an edition, a foundry run, a proof, a mail, a submission).

const detailPatterns = [/^\/stock\/\d+$/, /^\/puzzles\/\d+$/, /^\/editions\/[^/]+$/, /^\/foundry\/runs\/[^/]+$/, /^\/proofs\/[^/]+$/, /^\/admin\/mailbox\/[^/]+$/, /^\/submissions\/[^/]+$/];

type Finding = { path: string; what: string };

/** Pages reached by a tab rather than a link of the navigation. */
const extraPaths: Partial<Record<DemoRole, string[]>> = { setter: ['/submit?tab=upload', '/submit?tab=sketch'] };

async function check(page: Page, path: string, findings: Finding[]) {
  await page.goto(path);
  await page.waitForLoadState('networkidle').catch(() => undefined);
  await page.locator('main').first().waitFor();
  await page.waitForTimeout(300);
  for (const v of await seriousAxeViolations(page)) findings.push({ path, what: `${v.impact} ${v.id}: ${v.help} at ${v.targets.slice(0, 3).join(' | ')}` });
}

describe('every page: no serious accessibility finding and no console error', () => {
  const harness = useBrowser();

  it('the signed-out pages', { timeout: 120_000 }, async () => {
    const page = harness.page();
    const findings: Finding[] = [];
    for (const path of ['/sign-in', '/forgot-password', '/reset-password?token=abc', '/invite/not-a-token']) await check(page, path, findings);
    expect(findings).toEqual([]);
    expect(harness.consoleErrors()).toEqual([]);
  });

  for (const role of ['admin', 'editor', 'setter', 'printer'] as DemoRole[]) {
    it(`every page of the ${role}`, { timeout: 300_000 }, async () => {
      const page = harness.page();
      await signIn(page, role);
      const hrefs = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').evaluateAll((links) => links.map((a) => (a as HTMLAnchorElement).pathname));
      const findings: Finding[] = [];
      const seen: string[] = [];
      const details = new Map<RegExp, string>();
      for (const path of ['/', ...new Set(hrefs), ...(extraPaths[role] ?? [])]) {
        await check(page, path, findings);
        seen.push(path);
        const links = await page.locator('main a[href^="/"]').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).pathname));
        for (const href of links) {
          const pattern = detailPatterns.find((p) => p.test(href));
          if (pattern && !details.has(pattern)) details.set(pattern, href);
        }
      }
      for (const path of details.values()) {
        await check(page, path, findings);
        seen.push(path);
      }
      await screenshot(page, `every-page-${role}-last`);
      // the role's navigation and at least one detail page were visited
      expect(seen.length).toBeGreaterThan(2);
      if (role === 'admin' || role === 'editor') expect(details.size).toBeGreaterThan(0);
      expect(findings).toEqual([]);
      expect(harness.consoleErrors()).toEqual([]);
    });
  }
});
