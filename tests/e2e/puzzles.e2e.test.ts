import { describe, expect, it } from 'vitest';
import { puzzleDetailSchema } from '../../shared/contracts/puzzles';
import { verifyTiling } from '../../shared/tiling/index';
import { seriousAxeViolations } from './helpers/axe';
import { screenshot, signIn, useBrowser } from './helpers/browser';

// Puzzles in a real browser against the built app (the proof runs in the worker bundle):
// an editor makes a Deduction puzzle from a stock tiling and sees the verdict, then hides
// every given and sees it reported as not unique. Check values: the tiling verifies with
// the tiling engine (itself checked against the published catalogue), and every step of
// the solution names the true size of its square.

describe('puzzles in the browser', () => {
  const harness = useBrowser();

  it('an editor makes a Deduction puzzle from a stock tiling and sees the verdict', async () => {
    const page = harness.page();
    await signIn(page, 'editor');
    await page.goto('/stock');
    await page.getByRole('heading', { name: 'Stock', level: 1 }).waitFor();
    const firstRow = page.getByRole('table', { name: 'Stock tilings' }).getByRole('row').nth(1);
    await firstRow.waitFor();
    await firstRow.getByRole('cell').nth(1).click();
    await page.getByRole('link', { name: 'Make a puzzle' }).click();
    await page.getByRole('heading', { name: 'Make a puzzle', level: 1 }).waitFor();
    await page.getByRole('img', { name: /Squared rectangle/ }).waitFor();
    await screenshot(page, 'puzzle-new');
    expect(await seriousAxeViolations(page)).toEqual([]);
    const form = page.getByRole('form', { name: 'Make a puzzle' });
    await form.getByLabel('Deduction').check();
    await form.getByLabel('Level').selectOption('2');
    await form.getByRole('button', { name: 'Make and prove' }).click();
    await page.waitForURL(/\/puzzles\/\d+$/);
    const verdict = page.getByRole('region', { name: 'Verdict' });
    await expect.poll(() => verdict.innerText(), { timeout: 60_000, interval: 300 }).toMatch(/Unique/);
    expect(await verdict.innerText()).toMatch(/Certificate current: printable/);
    await screenshot(page, 'puzzle-workbench-unique');
    // axe-core WCAG A/AA: no serious or critical finding on the workbench (screens.md)
    expect(await seriousAxeViolations(page)).toEqual([]);

    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const api = puzzleDetailSchema.parse(await (await page.request.get(`/api/puzzles/${id}`)).json());
    expect(verifyTiling(api.tiling).ok).toBe(true);
    for (const s of api.steps) expect(s.value).toBe(api.tiling.squares[s.square]!.s);
    expect(api.level).toBe(2);

    // the print preview: the solution tab lists the steps
    await page.getByRole('tab', { name: 'Solution' }).click();
    const steps = page.getByRole('list', { name: 'Steps' });
    if (api.steps.length > 0) await expect.poll(() => steps.getByRole('listitem').count()).toBe(api.steps.length);

    // hide every given: the layout alone fixes the sizes only up to scale -> not unique
    const chosen = page.getByRole('checkbox', { checked: true });
    const n = await chosen.count();
    expect(n).toBe(api.givens.length);
    for (let i = 0; i < n; i++) await page.getByRole('checkbox', { checked: true }).first().click();
    await page.getByText('0 givens chosen').waitFor();
    await page.getByRole('button', { name: 'Prove again' }).click();
    await expect.poll(() => verdict.innerText(), { timeout: 60_000, interval: 300 }).toMatch(/Not unique/);
    expect(await verdict.innerText()).toMatch(/Not printable/);
    await screenshot(page, 'puzzle-workbench-not-unique');

    // the list shows it
    await page.goto('/puzzles');
    await page.getByRole('heading', { name: 'Puzzles', level: 1 }).waitFor();
    await expect.poll(() => page.getByRole('table', { name: 'Puzzles' }).innerText()).toMatch(/Not unique/);
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(harness.consoleErrors()).toEqual([]);
  }, 240_000);

  it('the demo carries proved Assembly puzzles: list filtered by kind, workbench with frame and pieces', async () => {
    const page = harness.page();
    await signIn(page, 'editor');
    await page.goto('/puzzles?kind=assembly');
    const table = page.getByRole('table', { name: 'Puzzles' });
    await expect.poll(() => table.innerText(), { timeout: 20_000 }).toMatch(/Assembly/);
    expect(await table.innerText()).not.toMatch(/Deduction/);
    await table.getByRole('link', { name: /^Assembly / }).first().click();
    await page.waitForURL(/\/puzzles\/\d+$/);
    const verdict = page.getByRole('region', { name: 'Verdict' });
    await expect.poll(() => verdict.innerText(), { timeout: 30_000 }).toMatch(/Unique/);
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const api = puzzleDetailSchema.parse(await (await page.request.get(`/api/puzzles/${id}`)).json());
    expect(api.kind).toBe('assembly');
    // the pieces drawn beside the frame are the tiling's sizes less the starter pieces
    const pieces = page.getByRole('img', { name: /pieces to place/ });
    expect(await pieces.getAttribute('aria-label')).toBe(`${api.tiling.squares.length - api.starters.length} pieces to place`);
    await screenshot(page, 'puzzle-workbench-assembly');
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(harness.consoleErrors()).toEqual([]);
  }, 120_000);
});
