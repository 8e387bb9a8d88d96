import { describe, expect, it } from 'vitest';
import { screenshot, signIn, useBrowser } from './helpers/browser';

// The foundry in a real browser against the built app (worker bundle dist/server/job-worker.js):
// an editor starts a small exhaustive run and watches it finish.
// Check values: OEIS A002839 / A002881 give 2 simple perfect and 1 simple imperfect of order 9.

describe('foundry in the browser', () => {
  const harness = useBrowser();

  it('an editor starts an order-9 run and sees it finish with 3 tilings found', async () => {
    const page = harness.page();
    await signIn(page, 'editor');
    await page.goto('/foundry');
    await page.getByRole('heading', { name: 'Foundry', level: 1 }).waitFor();
    const form = page.getByRole('form', { name: 'Start a foundry run' });
    await form.getByLabel('Mode').selectOption('exhaustive');
    await form.getByLabel('Order (number of squares)').fill('9');
    await form.getByRole('button', { name: 'Start run' }).click();
    const row = page.getByRole('row').filter({ hasText: 'Exhaustive, order 9' }).first();
    await row.waitFor();
    await expect.poll(() => row.innerText(), { timeout: 60_000, interval: 500 }).toMatch(/Done/);
    expect(await row.innerText()).toMatch(/3 tilings found/);
    await screenshot(page, 'foundry-run-done');
    await row.getByRole('link', { name: 'Results' }).click();
    await page.getByRole('heading', { name: 'Foundry run' }).waitFor();
    await expect.poll(() => page.getByRole('table', { name: 'Tilings found by this run' }).innerText(), { timeout: 10_000 }).toContain('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    await screenshot(page, 'foundry-run-results');
  }, 180_000);
});
