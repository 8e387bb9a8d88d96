import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { printerEditionSchema, type PrinterEdition } from '../../../shared/contracts/editions';
import edition41 from '../../fixtures/printer-edition-41.json';
import { meAs, renderApp, stubFetch } from '../app/render-app';

// The printer's proof page (/proofs/:id) against a stubbed API. The edition is what the demo
// server answered the demo printer for The Saturday Quadrant No. 41 (GET /api/editions/:id,
// recorded 2026-12-04 from `npm run dev` on a new demo database): proof v1 of the
// newspaper-column template, whose preflight (read from the finished PDF/X file) carries the
// template floor error the demo desk sent past with a reason, and one warning.

const edition: PrinterEdition = printerEditionSchema.parse(edition41);
const proof = edition.proofs[0]!;
const pt2mm = (pt: number) => Math.round((pt / 72) * 25.4 * 10) / 10; // 1 in = 72 pt = 25.4 mm

function stubs(e: PrinterEdition) {
  return stubFetch({
    'GET /api/me': meAs('printer'),
    [`GET /api/editions/${e.id}`]: { body: e },
    [`POST /api/editions/${e.id}/proofs/1/approve`]: () => ({ body: { ...e, state: 'approved', proofs: [{ ...proof, status: 'approved' }] } }),
  });
}

describe('the printer’s proof page', () => {
  it('labels errors and warnings, and shows the preflight page by page as the file gives it', async () => {
    expect(proof.preflight.ok).toBe(false);
    stubs(edition);
    const user = userEvent.setup();
    renderApp(`/proofs/${edition.id}`);
    await screen.findByRole('heading', { name: 'Proof v1' }, { timeout: 10_000 });
    const [error, warning] = proof.preflight.warnings;
    expect(error!.code).toBe('error:square-small');
    expect(screen.getByText(`Error: ${error!.message}`)).toBeTruthy();
    expect(screen.getByText(`Warning: ${warning!.message}`)).toBeTruthy();

    await user.click(screen.getByText('Preflight page by page'));
    expect(screen.getByText(/^PDF\/X-1a:2003 \(PDF 1\.4\) · output intent IFRA26, registered at http:\/\/www\.color\.org · Trapped False · document ID present · XMP present$/)).toBeTruthy();
    const table = screen.getByRole('table', { name: 'Preflight of each page' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(proof.pages);
    for (const [i, row] of rows.entries()) {
      const r = proof.preflight.pageReports![i]!;
      const cells = within(row).getAllByRole('cell').map((c) => c.textContent);
      // the trim shown is the TrimBox converted to millimetres, and the bleed is MediaBox beyond it
      const [x0, y0, x1, y1] = r.boxes.trim!;
      expect(cells[1]).toBe(`${pt2mm(x1 - x0)} × ${pt2mm(y1 - y0)} mm`);
      expect(cells[2]).toBe(`${pt2mm(x0 - r.boxes.media![0])} mm`);
      expect(cells.slice(3)).toEqual(['yes', 'DeviceCMYK', `${r.fonts.length} of ${r.fonts.length}`, `${r.smallestTypePt} pt`, `${r.thinnestLinePt} pt`, 'none']);
    }
  });

  it('asks before approving, says the preflight found errors, and approves only on confirmation', async () => {
    const { calls } = stubs(edition);
    const user = userEvent.setup();
    renderApp(`/proofs/${edition.id}`);
    await user.click(await screen.findByRole('button', { name: 'Approve for press' }, { timeout: 10_000 }));
    let dialog = await screen.findByRole('dialog', { name: 'Approve proof v1 for press?' });
    expect(dialog.textContent).toMatch(/without the PROOF stamp/);
    expect(within(dialog).getByText(/found errors/)).toBeTruthy();
    await user.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
    await user.click(screen.getByRole('button', { name: 'Approve for press' }));
    dialog = await screen.findByRole('dialog', { name: 'Approve proof v1 for press?' });
    await user.click(within(dialog).getByRole('button', { name: 'Approve proof v1' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST').map((c) => c.path)).toEqual([`/api/editions/${edition.id}/proofs/1/approve`]));
    expect(await screen.findByText(/^Approved\./)).toBeTruthy();
  });

  it('shows a report stored before PDF/X without the page table, and no error line when the preflight passed', async () => {
    const { pdfx: _pdfx, pageReports: _pages, ...old } = proof.preflight;
    const passed = { ...old, ok: true, warnings: [] };
    stubs({ ...edition, proofs: [{ ...proof, preflight: passed }] });
    const user = userEvent.setup();
    renderApp(`/proofs/${edition.id}`);
    await screen.findByRole('heading', { name: 'Proof v1' }, { timeout: 10_000 });
    expect(screen.queryByText('Preflight page by page')).toBeNull();
    await user.click(screen.getByRole('button', { name: 'Approve for press' }));
    const dialog = await screen.findByRole('dialog', { name: 'Approve proof v1 for press?' });
    expect(within(dialog).queryByText(/found errors/)).toBeNull();
  });
});
