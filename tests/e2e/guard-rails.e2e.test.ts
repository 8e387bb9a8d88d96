import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { editionSchema, publishCheckSchema } from '../../shared/contracts/editions';
import { puzzleDetailSchema } from '../../shared/contracts/puzzles';
import { verifyTiling } from '../../shared/tiling/index';
import { baseUrl, screenshot, signIn, useBrowser } from './helpers/browser';

// Issue 16 in a real browser against the built app in demo mode, items 1, 2, 3 and 5:
// 1. an empty edition cannot go to proof, an unsaved slot disables "Send to proof" and
//    leaving the composer with it asks first; the server refuses the send itself;
// 3. the solution page of the edition's PDF names, in its text, every square the Deduction's
//    step list names (letters read back with poppler's pdftotext, a tool outside the project);
// 2. publishing before the edition's date and ahead of an earlier unpublished edition of the
//    same publication is refused for an editor (dialog and API), and goes through only for an
//    admin with a reason, which the edition then lists;
// 5. a tiling pasted at twice the size of a stock tiling is flagged "Same as stock tiling N at
//    2x" in the review queue's badge and in the drawer, alike.
// The edition made here is Squared Away Monthly No. 90, dated 45 days ahead (after the demo's
// unpublished No. 12), so no other e2e file's editions are touched.

const hasPdftotext = spawnSync('pdftotext', ['-v']).status === 0;
const NUMBER = 90;

function isoDayFromToday(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

async function call(page: Page, method: string, path: string, data?: unknown): Promise<{ status: number; body: unknown }> {
  const res = await page.request.fetch(path, { method, headers: { origin: baseUrl() }, ...(data === undefined ? {} : { data }) });
  const text = await res.text();
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    // a PDF or an empty answer
  }
  return { status: res.status(), body };
}

/** Every word on each page of a PDF, with poppler's pdftotext (one call per page). */
function pdfPages(pdf: Buffer): string[][] {
  const dir = mkdtempSync(join(tmpdir(), 'sw-guard-'));
  const file = join(dir, 'edition.pdf');
  writeFileSync(file, pdf);
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1] ?? 0);
  const out: string[][] = [];
  for (let p = 1; p <= pages; p++) out.push(execFileSync('pdftotext', ['-f', String(p), '-l', String(p), file, '-'], { encoding: 'utf8' }).split(/\s+/).filter(Boolean));
  return out;
}

describe('guard rails in the browser', () => {
  const harness = useBrowser();
  // shared across the tests of this file, in order
  let editionId = '';
  let deductionId = 0;

  it('an empty edition cannot go to proof; an unsaved slot disables Send and leaving asks first', { timeout: 120_000 }, async () => {
    const editor = harness.page();
    await signIn(editor, 'editor');
    const pubs = (await call(editor, 'GET', '/api/publications')).body as { items?: { id: string; title: string }[] } | { id: string; title: string }[];
    const list = Array.isArray(pubs) ? pubs : (pubs.items ?? []);
    const monthly = list.find((p) => p.title === 'Squared Away Monthly');
    expect(monthly, 'the demo publication Squared Away Monthly').toBeTruthy();
    // the new edition form offers the publication's next number (item 8), here overridden with 90
    const existing = (await call(editor, 'GET', `/api/editions?publicationId=${monthly!.id}`)).body as { items: { number: number }[] };
    const next = Math.max(0, ...existing.items.map((e) => e.number)) + 1;
    expect(next).toBeGreaterThan(1);
    await editor.goto('/editions');
    await editor.getByRole('button', { name: 'New edition' }).click();
    await editor.getByLabel('Publication').selectOption({ label: 'Squared Away Monthly' });
    const number = editor.getByLabel('Number');
    await expect.poll(() => number.inputValue(), { timeout: 15_000 }).toBe(String(next));
    await number.fill(String(NUMBER));
    await editor.getByLabel('Date').fill(isoDayFromToday(45));
    await editor.getByRole('button', { name: 'Create draft' }).click();
    await editor.waitForURL(/\/editions\/[^/]+$/);
    editionId = new URL(editor.url()).pathname.split('/').pop()!;
    const edition = editionSchema.parse((await call(editor, 'GET', `/api/editions/${editionId}`)).body);
    expect(edition).toMatchObject({ number: NUMBER, state: 'draft', slots: [] });

    // a printable Deduction puzzle of its own (proved unique, certificate current), made through
    // the API from an unused stock tiling: other e2e files (print.e2e) put the demo's and their
    // own newest puzzles into Squared Away Monthly editions, and a puzzle or tiling printed there
    // again fails 'solution printed once' and the reuse window, as it should. The first unused
    // tilings are left to the files that take them through the stock page.
    const unused = (await call(editor, 'GET', '/api/stock?used=unused&perfect=true&sort=order&pageSize=50')).body as { items: { id: number }[] };
    expect(unused.items.length).toBeGreaterThan(12);
    const made = (await call(editor, 'POST', '/api/puzzles', { stockId: unused.items[12]!.id, kind: 'deduction' })).body as { id: number };
    expect(Number.isInteger(made.id)).toBe(true);
    await expect
      .poll(async () => puzzleDetailSchema.parse((await call(editor, 'GET', `/api/puzzles/${made.id}`)).body).status, { timeout: 90_000, interval: 500 })
      .not.toBe('proving');
    expect(puzzleDetailSchema.parse((await call(editor, 'GET', `/api/puzzles/${made.id}`)).body)).toMatchObject({ kind: 'deduction', status: 'unique', certificateCurrent: true, usedIn: [] });
    deductionId = made.id;

    await editor.goto(`/editions/${editionId}`);
    await editor.getByRole('heading', { name: `Squared Away Monthly No. ${NUMBER}`, level: 1 }).waitFor();
    const send = editor.getByRole('button', { name: 'Send to proof' });
    // with no puzzle the checks fail, so Send stays disabled and says why
    await editor.getByText('Fix the failed checks first.').waitFor({ timeout: 30_000 });
    expect(await send.isDisabled()).toBe(true);
    // the server refuses the empty proof itself, whatever the client does
    const empty = await call(editor, 'POST', `/api/editions/${editionId}/proofs`, { updatedAt: edition.updatedAt });
    expect([409, 422]).toContain(empty.status);
    expect(JSON.stringify(empty.body)).toMatch(/puzzle/i);
    expect(editionSchema.parse((await call(editor, 'GET', `/api/editions/${editionId}`)).body)).toMatchObject({ state: 'draft', proofs: [] });

    // a slot added but not saved: the unsaved-changes bar, Send disabled with the reason
    await editor.getByLabel('Puzzle', { exact: true }).selectOption(String(deductionId));
    await editor.getByRole('button', { name: 'Add slot' }).click();
    await editor.getByRole('region', { name: 'Unsaved changes' }).waitFor();
    await editor.getByText('Save your changes first: a proof is made from the saved edition.').waitFor();
    expect(await send.isDisabled()).toBe(true);
    // a send from the saved (empty) state is still refused; the slot is not lost on the screen
    expect([409, 422]).toContain((await call(editor, 'POST', `/api/editions/${editionId}/proofs`, { updatedAt: edition.updatedAt })).status);

    // leaving asks first; staying keeps the working copy
    await editor.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Editions' }).click();
    const leave = editor.getByRole('dialog', { name: 'Leave without saving?' });
    await leave.waitFor();
    await screenshot(editor, 'guard-rails-leave-unsaved');
    await leave.getByRole('button', { name: 'Cancel' }).click();
    expect(new URL(editor.url()).pathname).toBe(`/editions/${editionId}`);
    await editor.getByRole('region', { name: 'Unsaved changes' }).waitFor();

    // saved: Send is offered once the checks have run on the saved edition
    await editor.getByRole('button', { name: 'Save changes' }).click();
    await editor.getByText('Saved.', { exact: true }).waitFor();
    await expect.poll(() => send.isDisabled(), { timeout: 60_000, interval: 500 }).toBe(false);
    const saved = editionSchema.parse((await call(editor, 'GET', `/api/editions/${editionId}`)).body);
    expect(saved.slots.map((s) => s.puzzleId)).toEqual([String(deductionId)]);
    expect(harness.consoleErrors()).toEqual([]);
  });

  it.skipIf(!hasPdftotext)('the solution page names every square of the step list by its letter (pdftotext)', { timeout: 120_000 }, async () => {
    expect(editionId).not.toBe('');
    const editor = harness.page();
    await signIn(editor, 'editor');
    const detail = puzzleDetailSchema.parse((await call(editor, 'GET', `/api/puzzles/${deductionId}`)).body);
    expect(verifyTiling(detail.tiling).ok).toBe(true);
    // the steps name squares by letter; each step's value is its square's true side
    for (const s of detail.steps) expect(s.value).toBe(detail.tiling.squares[s.square]!.s);
    const named = [...new Set(detail.steps.map((s) => s.label))];
    expect(named.length).toBeGreaterThan(2);
    const res = await editor.request.get(`/api/editions/${editionId}/preview.pdf`);
    expect(res.status()).toBe(200);
    const pages = pdfPages(Buffer.from(await res.body()));
    // Squared Away Monthly prints its solutions at the back of the same edition
    const solutionPage = pages.findIndex((words) => words.includes('Solutions'));
    expect(solutionPage, 'a page headed Solutions').toBeGreaterThanOrEqual(0);
    const words = new Set(pages[solutionPage]);
    for (const label of named) expect(words, `square ${label} on the solution page`).toContain(label);
    expect(pages[solutionPage]!.join(' ')).toMatch(/not to scale/);
  });

  it('publishing ahead of the date and of No. 12 is refused to an editor, and done by an admin with a reason', { timeout: 180_000 }, async () => {
    expect(editionId).not.toBe('');
    const editor = harness.page();
    await signIn(editor, 'editor');
    await editor.goto(`/editions/${editionId}`);
    const send = editor.getByRole('button', { name: 'Send to proof' });
    await expect.poll(() => send.isDisabled(), { timeout: 60_000, interval: 500 }).toBe(false);
    await send.click();
    const sendDialog = editor.getByRole('dialog', { name: `Send No. ${NUMBER} to proof?` });
    await sendDialog.waitFor();
    const why = sendDialog.getByLabel('Why send it past the preflight’s errors?');
    if (await why.count()) await why.fill('The demo puzzle is drawn at the column width; checked by eye.');
    await sendDialog.getByRole('button', { name: /^Send proof v1/ }).click();
    await editor.getByText('Proof v1 is with the printer.', { exact: false }).waitFor({ timeout: 60_000 });

    // the printer approves it (through the API; the proof page's own flow is in print.e2e)
    const printerContext = await harness.newContext();
    const printer = await printerContext.newPage();
    await signIn(printer, 'printer');
    const approved = await call(printer, 'POST', `/api/editions/${editionId}/proofs/1/approve`);
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);

    // the editor: the dialog says the date, what it makes payable and why not yet; no way through
    await editor.reload();
    await editor.getByRole('button', { name: 'Mark published' }).click();
    const dialog = editor.getByRole('dialog', { name: `Publish No. ${NUMBER}?` });
    await dialog.getByText('Not yet').waitFor({ timeout: 30_000 });
    const check = publishCheckSchema.parse((await call(editor, 'GET', `/api/editions/${editionId}/publish-check`)).body);
    expect(check.blockers.map((b) => b.code).sort()).toEqual(['early', 'out-of-order']);
    const text = await dialog.innerText();
    expect(text).toMatch(/is dated/);
    expect(text).toMatch(/fees payable|No fee becomes payable/);
    expect(text).toContain('No. 12');
    expect(text).toContain('Only an admin may publish it now, with a reason.');
    expect(await dialog.getByRole('button', { name: `Publish No. ${NUMBER} anyway` }).isDisabled()).toBe(true);
    await screenshot(editor, 'guard-rails-publish-refused');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    // the server refuses it too, with and without a reason, for an editor
    expect((await call(editor, 'POST', `/api/editions/${editionId}/publish`, {})).status).toBe(409);
    expect((await call(editor, 'POST', `/api/editions/${editionId}/publish`, { override: { reason: 'The editor would like it out now.' } })).status).toBe(403);
    expect(editionSchema.parse((await call(editor, 'GET', `/api/editions/${editionId}`)).body).state).toBe('approved');

    // an admin publishes it with a reason; the guards passed are recorded and listed
    const adminContext = await harness.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, 'admin');
    await admin.goto(`/editions/${editionId}`);
    await admin.getByRole('button', { name: 'Mark published' }).click();
    const adminDialog = admin.getByRole('dialog', { name: `Publish No. ${NUMBER}?` });
    await adminDialog.getByText('Not yet').waitFor({ timeout: 30_000 });
    await adminDialog.getByLabel('Why publish it now?').fill('A special issue for the puzzle fair, agreed with the desk.');
    await adminDialog.getByRole('button', { name: `Publish No. ${NUMBER} anyway` }).click();
    await expect.poll(async () => editionSchema.parse((await call(admin, 'GET', `/api/editions/${editionId}`)).body).state, { timeout: 30_000 }).toBe('published');
    const guards = admin.getByText('A special issue for the puzzle fair, agreed with the desk.');
    await expect.poll(() => guards.count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await screenshot(admin, 'guard-rails-published-with-reason');
    expect(harness.consoleErrors().filter((e) => !/409|403/.test(e))).toEqual([]);
  });

  it('a tiling at twice the size of a stock tiling is flagged alike in the queue badge and the drawer', { timeout: 120_000 }, async () => {
    const editor = harness.page();
    await signIn(editor, 'editor');
    // a stock tiling (the editor's API), its Bouwkamp code scaled by 2 in every size
    const stock = (await call(editor, 'GET', '/api/stock/1')).body as { id: number; bouwkamp: string; width: number; height: number };
    expect(stock.id).toBe(1);
    const [head, ...rest] = stock.bouwkamp.split(' (');
    const [order, w, h] = head!.split(' ').map(Number);
    const doubled = `${order} ${w! * 2} ${h! * 2} (${rest.join(' (').replace(/\d+/g, (n) => String(Number(n) * 2))}`;
    const title = `Twice stock 1 (${Date.now()})`;

    const setterContext = await harness.newContext();
    const setter = await setterContext.newPage();
    await signIn(setter, 'setter');
    await setter.goto('/submit');
    await setter.getByLabel('Bouwkamp or table code').fill(doubled);
    await setter.getByLabel('Title (optional)').fill(title);
    const submit = setter.getByRole('button', { name: 'Submit for review' });
    await expect.poll(() => submit.isDisabled(), { timeout: 15_000 }).toBe(false);
    await submit.click();
    await setter.getByText('Submitted', { exact: true }).waitFor();

    await editor.goto(`/review?q=${encodeURIComponent(title)}`);
    const table = editor.getByRole('table', { name: 'Submissions to review' });
    const row = table.getByRole('row').filter({ hasText: title });
    await row.waitFor();
    const badge = 'Same as stock tiling 1 at 2x';
    expect(await row.innerText()).toContain(badge);
    // the row opens from the keyboard; the drawer says the same
    await row.focus();
    await editor.keyboard.press('Enter');
    const drawer = editor.getByRole('dialog', { name: title });
    await drawer.waitFor();
    await expect.poll(() => drawer.innerText()).toMatch(/Same as\s+stock tiling 1 at 2x \(already in the stock\)/);
    await screenshot(editor, 'guard-rails-2x-duplicate');
    expect(harness.consoleErrors()).toEqual([]);
  });
});
