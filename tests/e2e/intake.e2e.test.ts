import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { orientations, parseTiling, toBouwkamp } from '../../shared/tiling/index';
import { sideBySide } from '../../server/areas/intake/demo-seed';
import { waitForMail } from './helpers/mailbox';
import { demoAccount, screenshot, signIn, useBrowser } from './helpers/browser';

// Intake end to end in Chromium on the demo: the demo setter pastes a code and uploads a
// file with good, bad and duplicate lines and reads the report; the editor accepts one and
// rejects one from the review queue and finds the accepted one in the stock; the setter
// sees both outcomes, and the admin finds both mails in the Mailbox (local).
//
// Codes: compound tilings made here by our engine (two published rectangles side by side,
// scaled to a common height: facts.md's 33 x 32 and 69 x 61, and two of the order-10
// rectangles of squaring.net's o10spsr.bkp), so nothing seeded in the demo stock equals them.
const o9 = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
const o9b = parseTiling('9 69 61 (36,33)(5,28)(25,9,2)(7)(16)');
const pastedTiling = sideBySide(o9, o9b);
const pasted = toBouwkamp(pastedTiling, { header: true });
const acceptTiling = sideBySide(parseTiling('10 65 47 (25,17,23)(11,6)(5,24)(22,3)(19)'), o9);
const rejectTiling = sideBySide(parseTiling('10 105 104 (60,45)(19,26)(44,16)(12,7)(33)(28)'), o9b);
const mirrored = orientations(pastedTiling).find((t) => toBouwkamp(t) !== toBouwkamp(pastedTiling))!;
const file = [
  '# e2e upload',
  `${toBouwkamp(acceptTiling, { header: true })} * E2E accept me`, // line 2 good
  `${toBouwkamp(rejectTiling, { header: true })} * E2E reject me`, // line 3 good
  '10 65 47 (25,17,23)(11,6)(5,24)(22,4)(19)', // line 4 bad: does not close
  toBouwkamp(mirrored), // line 5 duplicate: the pasted one, turned
].join('\n');

async function openReviewRow(page: Page, title: string) {
  await page.goto('/review');
  await page.getByRole('heading', { name: 'Review queue', level: 1 }).waitFor();
  const row = page.getByRole('row', { name: new RegExp(title) });
  await row.waitFor({ timeout: 15_000 });
  await row.click();
  const drawer = page.getByRole('dialog');
  await drawer.getByRole('img', { name: /Squared rectangle/ }).waitFor();
  await drawer.getByRole('img', { name: /Smith diagram/ }).waitFor();
  return drawer;
}

describe('intake in the browser', () => {
  const harness = useBrowser();

  it('setter submits by paste and by file; editor accepts one and rejects one; setter sees both, with mails', async () => {
    const setter = harness.page();
    await signIn(setter, 'setter');
    await setter.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Submit' }).click();
    await setter.getByRole('heading', { name: 'Submit', level: 1 }).waitFor();

    // 1. Paste: live drawing and verdict, then submit.
    await setter.getByLabel('Bouwkamp or table code').fill(pasted);
    await setter.getByRole('img', { name: `Squared rectangle ${pastedTiling.W} by ${pastedTiling.H} of 18 squares` }).waitFor({ timeout: 15_000 });
    expect(await setter.getByText('Valid tiling').count()).toBe(1);
    await setter.getByLabel('Title (optional)').fill('E2E pasted');
    await screenshot(setter, 'intake-paste-verdict');
    await setter.getByRole('button', { name: 'Submit for review' }).click();
    await setter.getByText('Your tiling is in the review queue').waitFor();

    // 2. Upload: per-line report with good, bad and duplicate lines.
    await setter.getByRole('tab', { name: 'Upload file' }).click();
    await setter.getByLabel('or choose a file').setInputFiles({ name: 'e2e-codes.txt', mimeType: 'text/plain', buffer: Buffer.from(file) });
    const report = setter.getByRole('region', { name: 'Upload report' }).or(setter.locator('section[aria-label="Upload report"]'));
    await report.first().waitFor({ timeout: 20_000 });
    const text = await report.first().innerText();
    expect(text).toContain('3 new submissions'); // the duplicate of a pending one is sent too, flagged for the editor
    expect(text).toMatch(/2 valid, 1 duplicate, 1 invalid/);
    expect(text).toContain('already waiting for review');
    expect(text).toMatch(/wider than the free segment|does not|element/);
    await screenshot(setter, 'intake-upload-report');

    // 3. Editor: accept one, reject one, from the review queue.
    const editorContext = await harness.newContext();
    const editor = await editorContext.newPage();
    await signIn(editor, 'editor');
    let drawer = await openReviewRow(editor, 'E2E accept me');
    await screenshot(editor, 'intake-review-drawer');
    await drawer.getByRole('button', { name: 'Accept into the stock' }).click();
    await drawer.waitFor({ state: 'hidden' });
    drawer = await openReviewRow(editor, 'E2E reject me');
    await drawer.getByLabel('Note to the setter (needed to reject)').fill('Too close to one we printed last month.');
    await drawer.getByRole('button', { name: 'Reject' }).click();
    await drawer.waitFor({ state: 'hidden' });

    // 4. Editor finds the accepted tiling in the stock (order 19, from a setter) and opens it.
    await editor.goto('/stock?orderMin=19&orderMax=19&provenance=setter');
    const stockRow = editor.getByRole('row', { name: new RegExp(`${acceptTiling.W}.*${acceptTiling.H}`) });
    await stockRow.first().waitFor({ timeout: 15_000 });
    await screenshot(editor, 'intake-stock');
    await stockRow.first().click();
    await editor.getByRole('heading', { name: /Stock tiling \d+/ }).waitFor();
    expect(await editor.getByText(/^19 \d+ \d+ \(/).count()).toBeGreaterThan(0);
    expect(await editor.getByRole('link', { name: 'Make a puzzle' }).getAttribute('href')).toMatch(/\/puzzles\/new\?stockId=\d+/);
    await screenshot(editor, 'intake-stock-detail');

    // 5. The setter sees both outcomes and the note.
    await setter.goto('/submissions');
    await setter.getByRole('heading', { name: 'My submissions', level: 1 }).waitFor();
    const accepted = setter.getByRole('row', { name: /E2E accept me/ });
    const rejected = setter.getByRole('row', { name: /E2E reject me/ });
    await expect.poll(() => accepted.innerText(), { timeout: 15_000 }).toContain('Accepted');
    expect(await rejected.innerText()).toContain('Not accepted');
    expect(await rejected.innerText()).toContain('Too close to one we printed last month.');
    await screenshot(setter, 'intake-my-submissions');

    // 6. Both mails arrived in the Mailbox (local).
    const adminContext = await harness.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, 'admin');
    const { email } = await demoAccount('setter');
    const ok = await waitForMail(admin.request, { to: email, subject: /Accepted into the stock: E2E accept me/ });
    expect(ok.text).toContain(`${acceptTiling.W} x ${acceptTiling.H}`);
    const no = await waitForMail(admin.request, { to: email, subject: /Not accepted: E2E reject me/ });
    expect(no.text).toContain('Too close to one we printed last month.');
    expect(harness.consoleErrors()).toEqual([]);
  }, 240_000);

  it('setter sketches a network (the wheel W4), sees its tiling live and submits it', async () => {
    const setter = harness.page();
    await signIn(setter, 'setter');
    await setter.goto('/submit?tab=sketch');
    const canvas = setter.getByRole('application', { name: /Network sketch/ });
    await canvas.waitFor();
    const box = (await canvas.boundingBox())!;
    const at = (x: number, y: number) => setter.mouse.click(box.x + (x / 480) * box.width, box.y + (y / 360) * box.height);
    const pts: [number, number][] = [[240, 180], [140, 80], [340, 80], [340, 280], [140, 280]];
    await setter.getByLabel('Place nodes').check();
    for (const [x, y] of pts) await at(x, y);
    await setter.getByLabel('Draw edges').check();
    for (const [a, b] of [[0, 1], [0, 2], [0, 3], [0, 4], [1, 2], [2, 3], [3, 4], [4, 1]] as const) {
      await at(...pts[a]!);
      await at(...pts[b]!);
    }
    await setter.getByLabel('Choose poles').check();
    await at(...pts[1]!);
    await at(...pts[2]!);
    const result = setter.getByRole('region', { name: 'Tiling from the sketch' }).or(setter.locator('section[aria-label="Tiling from the sketch"]'));
    // W4 with a rim pole edge: 7 squares in a 7 x 8 rectangle; its network has 45 spanning trees (OEIS A004146)
    await result.first().getByRole('img', { name: /Squared rectangle 7 by 8 of 7 squares/ }).waitFor({ timeout: 15_000 });
    expect(await result.first().innerText()).toContain('45 spanning trees');
    await screenshot(setter, 'intake-sketch');
    await setter.getByRole('button', { name: 'Submit this tiling' }).click();
    await setter.getByText('Follow it on').waitFor();
  }, 120_000);

  it('printers see none of it: the intake and stock API answer 403', async () => {
    const printer = harness.page();
    await signIn(printer, 'printer');
    for (const path of ['/api/stock', '/api/submissions', '/api/stock/summary']) {
      expect((await printer.request.get(path)).status(), path).toBe(403);
    }
  }, 120_000);
});
