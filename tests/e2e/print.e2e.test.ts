import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { seriousAxeViolations } from './helpers/axe';
import { screenshot, signIn, useBrowser } from './helpers/browser';
import { waitForMail } from './helpers/mailbox';

// The proof round in a real browser against the built app in demo mode: the editor composes
// The Saturday Quadrant No. 42 (a demo draft) from two demo puzzles and sends it to proof, the printer returns it with a
// note, the editor changes the introduction and sends proof 2, the printer approves it
// and downloads the press file, which carries no PROOF stamp.

const hasPdftotext = spawnSync('pdftotext', ['-v']).status === 0;

describe('the proof round in the browser', () => {
  const harness = useBrowser();

  it('editor sends a proof, printer returns it, editor resends, printer approves and gets the press file', async () => {
    const editor = harness.page();
    await signIn(editor, 'editor');
    const list = await editor.request.get('/api/editions');
    expect(list.ok()).toBe(true);
    const { items } = (await list.json()) as { items: { id: string; number: number; publicationTitle: string; state: string; date: string }[] };
    const target = items.find((e) => e.publicationTitle === 'The Saturday Quadrant' && e.number === 42);
    expect(target?.state).toBe('draft');
    const id = target!.id;

    // The calendar shows it in its month with its state as text.
    await editor.goto(`/editions?month=${target!.date.slice(0, 7)}`);
    await editor.getByRole('heading', { name: 'Editions', level: 1 }).waitFor();
    await editor.getByRole('link', { name: /The Saturday Quadrant No\. 42/ }).first().click();
    await editor.getByRole('heading', { name: 'The Saturday Quadrant No. 42', level: 1 }).waitFor();
    expect(await editor.getByText('Check the proof before press').count()).toBeGreaterThan(0);

    // Compose: two puzzles the demo has not printed yet (the demo puzzles are made by the
    // engine from stock tilings at start-up), added through the slot picker, then reordered.
    const picker = editor.getByLabel('Puzzle', { exact: true });
    await picker.waitFor();
    const unused = await picker.locator('option').evaluateAll((os) => os.map((o) => ({ value: (o as HTMLOptionElement).value, text: o.textContent ?? '' })).filter((o) => o.value && o.text.includes('(unused)')));
    expect(unused.length).toBeGreaterThanOrEqual(2);
    for (const o of unused.slice(0, 2)) {
      await picker.selectOption(o.value);
      await editor.getByRole('button', { name: 'Add slot' }).click();
    }
    await editor.getByRole('button', { name: 'Move slot 2 up' }).click();
    await editor.getByRole('button', { name: 'Save slots' }).click();
    await editor.getByText('Slot 2', { exact: true }).waitFor();
    await expect.poll(async () => (await (await editor.request.get(`/api/editions/${id}`)).json()).slots.map((s: { puzzleId: string }) => s.puzzleId)).toEqual([unused[1]!.value, unused[0]!.value]);
    await editor.getByRole('button', { name: 'Run the checks again' }).click();
    await editor.getByText('Every puzzle has a current certificate.').waitFor({ timeout: 30_000 });
    await editor.getByRole('button', { name: 'Send to proof' }).click();
    await editor.getByText('Proof v1 sent').waitFor({ timeout: 30_000 });
    await screenshot(editor, 'edition-in-proof');

    // The printer finds it, and returns it with a note.
    const printerContext = await harness.newContext();
    const printer = await printerContext.newPage();
    await signIn(printer, 'printer');
    await printer.goto('/proofs');
    await printer.getByRole('link', { name: 'The Saturday Quadrant No. 42' }).click();
    await printer.getByRole('heading', { name: 'Proof v1' }).waitFor();
    await printer.getByLabel('Notes for the desk').fill('Please add the printing date to the introduction.');
    await printer.getByRole('button', { name: 'Return with notes' }).click();
    await printer.getByText('Returned to the desk with your notes.').waitFor();

    // The editor sees the note, changes the introduction and resends.
    await editor.reload();
    await editor.getByText('Please add the printing date to the introduction.').first().waitFor();
    const intro = editor.getByRole('textbox', { name: 'Introduction' });
    await intro.click();
    await editor.keyboard.press('Control+End');
    await editor.keyboard.type(' Printed for Saturday.');
    await editor.getByRole('button', { name: 'Save details' }).click();
    await editor.getByText('Saved.').waitFor();
    await editor.getByRole('button', { name: 'Send to proof' }).click();
    await editor.getByText('Proof v2 sent').waitFor({ timeout: 30_000 });

    // The printer approves proof 2 and downloads the press file.
    await printer.goto(`/proofs/${id}`);
    await printer.getByRole('heading', { name: 'Proof v2' }).waitFor();
    await printer.getByRole('button', { name: 'Approve for press' }).click();
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
      const text = spawnSync('pdftotext', [file, '-'], { encoding: 'utf8' }).stdout;
      expect(text).toContain('Printed for Saturday.');
      expect(text).toContain('Puzzle 1');
      expect(text).toContain('Puzzle 2');
      // the solutions of No. 41 (a demo edition) print here: The Saturday Quadrant puts them in the next edition
      expect(text).toMatch(/No\.? 41, puzzle 1/); // pdftotext sometimes drops the full stop after No
      expect(text).not.toMatch(/PROOF/);
    }

    // Mail went to the printer (proof ready) and to the editor (returned, approved).
    const adminContext = await harness.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, 'admin');
    await waitForMail(admin.request, { to: 'printer@demo.squarewright.test', subject: /Proof 2 ready: The Saturday Quadrant No\. 42/ });
    await waitForMail(admin.request, { to: 'editor@demo.squarewright.test', subject: /Proof 1 returned/ });
    await waitForMail(admin.request, { to: 'editor@demo.squarewright.test', subject: /Proof 2 approved/ });
  });

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
    const admin = harness.page();
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
    const editor = await (await harness.newContext()).newPage();
    await signIn(editor, 'editor');
    await editor.goto('/editions');
    await editor.getByRole('heading', { name: 'Editions', level: 1 }).waitFor();
    expect(await seriousAxeViolations(editor)).toEqual([]);
  });
});
