import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { puzzleDetailSchema, type PuzzleDetail } from '../../shared/contracts/puzzles';
import { verifyTiling } from '../../shared/tiling/index';
import { seriousAxeViolations } from './helpers/axe';
import { baseUrl, screenshot, signIn, useBrowser } from './helpers/browser';
import { waitForMail } from './helpers/mailbox';

// The proof round in a real browser against the built app in demo mode (issue 7 item 8): the
// editor derives two puzzles from stock tilings that no puzzle uses yet (Stock -> a tiling ->
// "Make a puzzle", one Assembly and one Deduction) and waits on the workbench until each is
// proved unique with a current certificate; then creates a new draft edition of Squared Away
// Monthly, composes it from exactly those two puzzles and sends it to proof. The printer
// returns it with a note, the editor changes the introduction and sends proof 2, the printer
// approves it and downloads the press file, which carries no PROOF stamp and prints the
// solutions of both derived puzzles (the Monthly prints them in the same edition).
// Check values: each derived tiling verifies with the tiling engine (itself checked against
// the published catalogue), every step of the Deduction solution names the true size of its
// square, and the press file lists each tiling's square sizes.

const hasPdftotext = spawnSync('pdftotext', ['-v']).status === 0;

type Derived = { id: string; kind: 'assembly' | 'deduction'; stockId: number; tiling: PuzzleDetail['tiling'] };

/** Stock page -> the first tiling no puzzle uses -> "Make a puzzle" -> the workbench, until it is proved unique. */
async function derivePuzzle(editor: Page, kind: 'assembly' | 'deduction', notStock: number[]): Promise<Derived> {
  // unused tilings, smallest order first (small tilings prove in well under a second)
  await editor.goto('/stock?used=unused&perfect=true&sort=order');
  await editor.getByRole('heading', { name: 'Stock', level: 1 }).waitFor();
  const rows = editor.getByRole('table', { name: 'Stock tilings' }).getByRole('row');
  await rows.nth(1).waitFor();
  let stockId = 0;
  for (let i = 1; stockId === 0; i++) {
    const row = rows.nth(i);
    const n = Number((await row.getByRole('cell').nth(1).innerText()).trim());
    expect(Number.isInteger(n) && n > 0).toBe(true);
    if (notStock.includes(n)) continue;
    stockId = n;
    await row.getByRole('cell').nth(1).click();
  }
  await editor.getByRole('heading', { name: `Stock tiling ${stockId}`, level: 1 }).waitFor();
  // no puzzle (demo or otherwise) has been made from it yet
  const provenance = editor.getByText('Puzzles derived', { exact: true }).locator('..');
  await expect.poll(() => provenance.innerText()).toMatch(/Puzzles derived\s+None yet\./);
  await editor.getByRole('link', { name: 'Make a puzzle' }).click();
  await editor.waitForURL(new RegExp(`/puzzles/new\\?stockId=${stockId}$`));
  await editor.getByRole('heading', { name: 'Make a puzzle', level: 1 }).waitFor();
  await editor.getByRole('img', { name: /Squared rectangle/ }).waitFor();
  const form = editor.getByRole('form', { name: 'Make a puzzle' });
  await form.getByLabel(kind === 'assembly' ? 'Assembly' : 'Deduction').check();
  await form.getByRole('button', { name: 'Make and prove' }).click();
  await editor.waitForURL(/\/puzzles\/\d+$/);
  const verdict = editor.getByRole('region', { name: 'Verdict' });
  await expect.poll(() => verdict.innerText(), { timeout: 90_000, interval: 300 }).toMatch(/\bUnique\b[\s\S]*Certificate current: printable/);
  const id = new URL(editor.url()).pathname.split('/').pop()!;
  const api = puzzleDetailSchema.parse(await (await editor.request.get(`/api/puzzles/${id}`)).json());
  expect(api.kind).toBe(kind);
  expect(api.stockId).toBe(stockId);
  expect(api.status).toBe('unique');
  expect(api.certificateCurrent).toBe(true);
  expect(verifyTiling(api.tiling).ok).toBe(true);
  for (const s of api.steps) expect(s.value).toBe(api.tiling.squares[s.square]!.s);
  return { id, kind, stockId, tiling: api.tiling };
}

/**
 * Send to proof from the edition page: the dialog says what will happen; preflight floor errors
 * (a half-scale Assembly piece under the template's floor) need the editor's reason.
 */
async function sendToProof(editor: Page, version: number): Promise<void> {
  const send = editor.getByRole('button', { name: 'Send to proof' });
  await expect.poll(() => send.isEnabled(), { timeout: 60_000 }).toBe(true);
  await send.click();
  const dialog = editor.getByRole('dialog', { name: /to proof\?$/ });
  await dialog.waitFor();
  const confirm = dialog.getByRole('button', { name: new RegExp(`^Send proof v${version}( anyway)?$`) });
  if ((await dialog.getByRole('textbox').count()) > 0) await dialog.getByRole('textbox').fill('Test: the small pieces are cut from card.');
  await confirm.click();
  await editor.getByText(`Proof v${version} is with the printer.`, { exact: false }).waitFor({ timeout: 60_000 });
}

/** Clicks a download link and returns the file the browser saved, with the name it suggested. */
async function download(page: Page, link: ReturnType<Page['getByRole']>): Promise<{ name: string; file: string }> {
  const [dl] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), link.click()]);
  const file = join(mkdtempSync(join(tmpdir(), 'sw-e2e-dl-')), dl.suggestedFilename());
  await dl.saveAs(file);
  return { name: dl.suggestedFilename(), file };
}

const hasUnzip = spawnSync('unzip', ['-v']).status === 0;

/** The layout package's files, checked with unzip and pdfinfo against its manifest and the puzzles' tilings. */
function checkPackage(zip: string, stems: string[], puzzles: Derived[]): void {
  if (!hasUnzip || !hasPdftotext) return; // CI installs both (.ci/run); elsewhere the download itself is the check
  expect(spawnSync('unzip', ['-tq', zip]).status).toBe(0);
  const dir = mkdtempSync(join(tmpdir(), 'sw-e2e-pkg-'));
  expect(spawnSync('unzip', ['-q', zip, '-d', dir]).status).toBe(0);
  const manifest = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as { files: { name: string; sha256: string; preflightOk?: boolean }[] };
  const parts = ['puzzle.pdf', 'puzzle.svg', 'solution.pdf', 'solution.svg', 'instructions.txt', 'solution.txt'];
  expect(manifest.files.map((f) => f.name).sort()).toEqual(stems.flatMap((s) => parts.map((p) => `${s}-${p}`)).sort());
  for (const f of manifest.files) expect(createHash('sha256').update(readFileSync(join(dir, f.name))).digest('hex'), f.name).toBe(f.sha256);
  stems.forEach((stem, i) => {
    const squares = [...readFileSync(join(dir, `${stem}-solution.txt`), 'utf8').matchAll(/^[A-Z]+: (\d+) at (\d+), (\d+)$/gm)].map((m) => `${m[1]}@${m[2]},${m[3]}`);
    expect(squares.sort()).toEqual(puzzles[i]!.tiling.squares.map((q) => `${q.s}@${q.x},${q.y}`).sort());
    for (const part of ['puzzle', 'solution']) {
      const info = spawnSync('pdfinfo', ['-box', join(dir, `${stem}-${part}.pdf`)], { encoding: 'utf8' }).stdout;
      const box = (name: string) => info.match(new RegExp(`^${name}:\\s+(.+)$`, 'm'))?.[1]?.trim();
      expect(box('TrimBox'), `${stem}-${part}.pdf`).toBe(box('MediaBox'));
      expect(readFileSync(join(dir, `${stem}-${part}.svg`), 'utf8')).toMatch(/<svg[\s\S]*<\/svg>\s*$/);
    }
  });
}

describe('the proof round in the browser', () => {
  const harness = useBrowser();

  it('editor derives two puzzles, composes an edition, sends a proof; printer returns it; editor resends; printer approves and gets the press file', async () => {
    const editor = harness.page();
    await signIn(editor, 'editor');

    // Derive one Assembly and one Deduction puzzle from two different unused tilings.
    const assembly = await derivePuzzle(editor, 'assembly', []);
    const deduction = await derivePuzzle(editor, 'deduction', [assembly.stockId]);
    expect(deduction.stockId).not.toBe(assembly.stockId);

    // A new draft edition of Squared Away Monthly, the month after its latest one.
    const list = await editor.request.get('/api/editions');
    expect(list.ok()).toBe(true);
    const { items } = (await list.json()) as { items: { id: string; number: number; publicationTitle: string; state: string; date: string }[] };
    const monthly = items.filter((e) => e.publicationTitle === 'Squared Away Monthly');
    expect(monthly.length).toBeGreaterThan(0);
    const number = Math.max(...monthly.map((e) => e.number)) + 1;
    const last = monthly.map((e) => e.date).sort().at(-1)!;
    const next = new Date(Date.UTC(Number(last.slice(0, 4)), Number(last.slice(5, 7)), 1));
    const date = next.toISOString().slice(0, 10);
    const title = `Squared Away Monthly No. ${number}`;
    await editor.goto(`/editions?month=${date.slice(0, 7)}`);
    await editor.getByRole('heading', { name: 'Editions', level: 1 }).waitFor();
    await editor.getByRole('button', { name: 'New edition' }).click();
    await editor.getByLabel('Publication').selectOption({ label: 'Squared Away Monthly' });
    await editor.getByLabel('Number').fill(String(number));
    await editor.getByLabel('Date').fill(date);
    await editor.getByRole('button', { name: 'Create draft' }).click();
    await editor.waitForURL(/\/editions\/[^/?]+$/);
    await editor.getByRole('heading', { name: title, level: 1 }).waitFor();
    const id = new URL(editor.url()).pathname.split('/').pop()!;
    expect(await editor.getByText('Check the proof before press').count()).toBeGreaterThan(0);

    // The calendar shows it in its month with its state as text.
    await editor.goto(`/editions?month=${date.slice(0, 7)}`);
    await editor.getByRole('link', { name: new RegExp(title.replace(/\./g, '\\.')) }).first().click();
    await editor.getByRole('heading', { name: title, level: 1 }).waitFor();

    // Compose: exactly the two derived puzzles, added through the slot picker (both
    // unused so far), then reordered.
    const picker = editor.getByLabel('Puzzle', { exact: true });
    await picker.waitFor();
    const options = await picker.locator('option').evaluateAll((os) => os.map((o) => ({ value: (o as HTMLOptionElement).value, text: o.textContent ?? '' })));
    for (const p of [assembly, deduction]) {
      const o = options.find((x) => x.value === p.id);
      expect(o?.text).toMatch(new RegExp(`^${p.kind === 'assembly' ? 'Assembly' : 'Deduction'} ${p.id}: .*\\(unused\\)$`));
      await picker.selectOption(p.id);
      await editor.getByRole('button', { name: 'Add slot' }).click();
    }
    await editor.getByRole('button', { name: 'Move slot 2 up' }).click();
    await editor.getByRole('button', { name: 'Save changes' }).click();
    await editor.getByText('Saved.', { exact: true }).waitFor();
    await expect.poll(async () => (await (await editor.request.get(`/api/editions/${id}`)).json()).slots.map((s: { puzzleId: string }) => s.puzzleId)).toEqual([deduction.id, assembly.id]);
    await editor.getByRole('button', { name: 'Run the checks again' }).click();
    await editor.getByText('Every puzzle has a current certificate.').waitFor({ timeout: 30_000 });
    // the reuse guard: the two tilings differ and no other Monthly edition used them
    await editor.getByText('No tiling repeats within 365 days in Squared Away Monthly.').waitFor();
    await sendToProof(editor, 1);
    await screenshot(editor, 'edition-in-proof');

    // The printer finds it, and returns it with a note.
    const printerContext = await harness.newContext();
    const printer = await printerContext.newPage();
    await signIn(printer, 'printer');
    await printer.goto('/proofs');
    await printer.getByRole('link', { name: title }).click();
    await printer.getByRole('heading', { name: 'Proof v1' }).waitFor();
    await printer.getByLabel('Notes for the desk').fill('Please add the printing month to the introduction.');
    await printer.getByRole('button', { name: 'Return with notes' }).click();
    await printer.getByText('Returned to the desk with your notes.').waitFor();

    // The editor sees the note, changes the introduction and resends.
    await editor.reload();
    await editor.getByText('Please add the printing month to the introduction.').first().waitFor();
    const intro = editor.getByRole('textbox', { name: 'Introduction' });
    await intro.click();
    await editor.keyboard.press('Control+End');
    await editor.keyboard.type(' Printed for the new month.');
    await editor.getByRole('button', { name: 'Save changes' }).click();
    await editor.getByText('Saved.', { exact: true }).waitFor();
    await sendToProof(editor, 2);

    // The printer approves proof 2 and downloads the press file.
    await printer.goto(`/proofs/${id}`);
    await printer.getByRole('heading', { name: 'Proof v2' }).waitFor();
    await printer.getByRole('button', { name: 'Approve for press' }).click();
    // it asks first, saying what the press file is made from
    const approve = printer.getByRole('dialog', { name: 'Approve proof v2 for press?' });
    await approve.getByText(/without the PROOF stamp/).waitFor();
    await approve.getByRole('button', { name: 'Approve proof v2' }).click();
    await printer.getByText(/^Approved\./).waitFor({ timeout: 30_000 });
    await printer.goto('/press-files');
    await printer.getByRole('link', { name: 'Download press file' }).first().waitFor();
    await screenshot(printer, 'press-files');
    const press = await printer.request.get(`/api/editions/${id}/press.pdf`);
    expect(press.ok()).toBe(true);
    const bytes = await press.body();
    expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    if (hasPdftotext) {
      const file = join(mkdtempSync(join(tmpdir(), 'sw-e2e-press-')), 'press.pdf');
      writeFileSync(file, bytes);
      const text = spawnSync('pdftotext', [file, '-'], { encoding: 'utf8' }).stdout.replace(/\s+/g, ' ');
      expect(text).toContain('Printed for the new month.');
      expect(text).toContain('Puzzle 1');
      expect(text).toContain('Puzzle 2');
      // Squared Away Monthly prints the solutions in the same edition: each derived tiling's sizes, largest first
      expect(text).toContain('Solutions');
      for (const p of [assembly, deduction]) expect(text).toContain(`${[...p.tiling.squares].map((q) => q.s).sort((a, b) => b - a).join(', ')}.`);
      expect(text).not.toMatch(/PROOF/);
    }

    // Package for layout, downloaded in the browser: the edition's zip from its page (named by
    // publication and number, a file per slot named by slot) and one puzzle's from the puzzle
    // page at The Saturday Quadrant's settings. unzip (Info-ZIP) reads them; every file's SHA-256
    // matches the manifest; the solution text lists exactly the engine's squares; pdfinfo (poppler)
    // finds each placeable PDF cut to the drawing (TrimBox = MediaBox).
    await editor.goto(`/editions/${id}`);
    await editor.getByRole('heading', { name: title, level: 1 }).waitFor();
    const pkg = await download(editor, editor.getByRole('link', { name: 'Package for layout' }));
    const stem = `squared-away-monthly-no${number}`;
    expect(pkg.name).toBe(`${stem}-layout-package.zip`);
    checkPackage(pkg.file, [`${stem}-slot1`, `${stem}-slot2`], [deduction, assembly]);
    await editor.goto(`/puzzles/${deduction.id}`);
    await editor.getByLabel('Settings of').selectOption({ label: 'The Saturday Quadrant (newspaper-column)' });
    const one = await download(editor, editor.getByRole('link', { name: 'Download package (.zip)' }));
    expect(one.name).toBe(`the-saturday-quadrant-puzzle${deduction.id}-layout-package.zip`);
    checkPackage(one.file, [`the-saturday-quadrant-puzzle${deduction.id}`], [deduction]);

    // Mail went to the printer (proof ready) and to the editor (returned, approved).
    const adminContext = await harness.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, 'admin');
    const subject = (s: string) => new RegExp(`${s}: ${title.replace(/\./g, '\\.')}`);
    await waitForMail(admin.request, { to: 'printer@demo.squarewright.test', subject: subject('Proof 2 ready') });
    await waitForMail(admin.request, { to: 'editor@demo.squarewright.test', subject: subject('Proof 1 returned') });
    await waitForMail(admin.request, { to: 'editor@demo.squarewright.test', subject: subject('Proof 2 approved') });
  }, 300_000);

  it('keeps the printer out of drafts and the stock, even by direct URL', async () => {
    const printer = harness.page();
    await signIn(printer, 'printer');
    const editorCtx = await harness.newContext();
    const editor = await editorCtx.newPage();
    await signIn(editor, 'editor');
    const { items } = (await (await editor.request.get('/api/editions')).json()) as { items: { id: string; state: string; latestProofVersion: number | null }[] };
    const draft = items.find((e) => e.state === 'draft' && e.latestProofVersion === null);
    expect(draft).toBeDefined();
    expect((await printer.request.get(`/api/editions/${draft!.id}`)).status()).toBe(404);
    expect((await printer.request.get(`/api/editions/${draft!.id}/preview.pdf`)).status()).toBe(403);
    expect((await printer.request.get('/api/stock')).status()).toBe(403);
  });

  it('shows the admin the publications and each template with a sample page, without serious accessibility findings', async () => {
    // axe-core is injected as an inline script, which our CSP refuses: these contexts bypass it
    const axeContext = () => harness.browser().newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 860 }, bypassCSP: true });
    const contexts = [await axeContext(), await axeContext()];
    try {
      const admin = await contexts[0]!.newPage();
      await signIn(admin, 'admin');
      await admin.goto('/admin/publications');
      await admin.getByRole('button', { name: 'Edit The Saturday Quadrant' }).waitFor();
      expect(await admin.getByText('Payouts are subject to local tax rules', { exact: false }).count()).toBeGreaterThan(0);
      // axe-core WCAG 2.1 A/AA rules: no serious or critical finding
      expect(await seriousAxeViolations(admin)).toEqual([]);
      await screenshot(admin, 'admin-publications');
      await admin.goto('/admin/templates');
      for (const name of ['A4 magazine page', 'US Letter page', 'Newspaper column']) await admin.getByRole('heading', { name }).waitFor();
      expect(await seriousAxeViolations(admin)).toEqual([]);
      const sample = await admin.request.get('/api/templates/newspaper-column/sample.pdf');
      expect(sample.ok()).toBe(true);
      expect((await sample.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-');
      await screenshot(admin, 'admin-templates');
      const editor = await contexts[1]!.newPage();
      await signIn(editor, 'editor');
      await editor.goto('/editions');
      await editor.getByRole('heading', { name: 'Editions', level: 1 }).waitFor();
      expect(await seriousAxeViolations(editor)).toEqual([]);
    } finally {
      for (const c of contexts) await c.close();
    }
  });
});
