import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { HAIRLINE_PT } from '../../../shared/contracts/press';
import demo from '../../fixtures/demo-press-and-printers.json';
import { meAs, renderApp, stubFetch } from '../app/render-app';

// The admin's "Press and printers" panel of a publication against a stubbed API. The answers are
// what the demo server gave the demo admin for The Saturday Quadrant (newspaper column; see the
// fixture's `recorded`); a second printer account is added to the candidates here, so that
// assigning can move the publication from one printer to another. The hairline floor is the
// contract's HAIRLINE_PT (0.25 pt, common practice).

const quadrant = demo.publications.items.find((p) => p.title === 'The Saturday Quadrant')!;
const second = { id: 'printer-2', name: 'Rosa Lindqvist', email: 'rosa@plant.example' };
const choices = { ...demo.printers, candidates: [...demo.printers.candidates, second] };

function stubs() {
  return stubFetch({
    'GET /api/me': meAs('admin'),
    'GET /api/publications': { body: demo.publications },
    [`GET /api/publications/${quadrant.id}/press-spec`]: { body: demo.pressSpec },
    [`GET /api/publications/${quadrant.id}/printers`]: { body: choices },
    [`PUT /api/publications/${quadrant.id}/press-spec`]: (call) => {
      const spec = call.body as typeof demo.pressSpec.spec;
      return { body: { ...demo.pressSpec, spec, effective: { ...demo.pressSpec.effective, ...Object.fromEntries(Object.entries(spec).filter(([, v]) => v !== null)) } } };
    },
    [`PUT /api/publications/${quadrant.id}/printers`]: (call) => ({ body: { items: choices.candidates.filter((p) => (call.body as { userIds: string[] }).userIds.includes(p.id)) } }),
  });
}

describe('Press and printers (admin, publications page)', () => {
  it('shows the spec in force over the template defaults, refuses a hairline, and saves only the fields given', async () => {
    const { calls } = stubs();
    const user = userEvent.setup();
    renderApp('/admin/publications');
    await user.click(await screen.findByRole('button', { name: 'Press and printers of The Saturday Quadrant' }, { timeout: 10_000 }));
    const e = demo.pressSpec.effective;
    expect(await screen.findByText(`In force: PDF/X-1a:2003, ${e.condition}, bleed ${e.bleedMm} mm, type from ${e.minTypePt} pt, lines from ${e.minLinePt} pt. Leave a field empty to take the template's value.`)).toBeTruthy();
    expect((screen.getByLabelText('Bleed (mm)') as HTMLInputElement).placeholder).toBe(`${demo.pressSpec.templateDefaults.bleedMm} (template)`);

    await user.type(screen.getByLabelText('Thinnest line (pt)'), String(HAIRLINE_PT / 2));
    await user.click(screen.getByRole('button', { name: 'Save press spec' }));
    expect(await screen.findByText(`thinnest line must be at least ${HAIRLINE_PT} pt (hairlines under it may not print)`)).toBeTruthy();
    expect(calls.filter((c) => c.method === 'PUT')).toEqual([]);

    await user.clear(screen.getByLabelText('Thinnest line (pt)'));
    await user.type(screen.getByLabelText('Thinnest line (pt)'), '0.3');
    await user.type(screen.getByLabelText('Bleed (mm)'), '5');
    await user.selectOptions(screen.getByLabelText('Output condition'), 'IFRA30');
    await user.click(screen.getByRole('button', { name: 'Save press spec' }));
    await waitFor(() =>
      expect(calls.filter((c) => c.method === 'PUT').map((c) => c.body)).toEqual([{ standard: null, condition: 'IFRA30', bleedMm: 5, minTypePt: null, minLinePt: 0.3 }]),
    );
    expect(await screen.findByText(/^Saved\. The next proof is made to this spec/)).toBeTruthy();
  });

  it('assigns the publication’s printers: the ticked accounts alone, sent as one list', async () => {
    const { calls } = stubs();
    const user = userEvent.setup();
    renderApp('/admin/publications');
    await user.click(await screen.findByRole('button', { name: 'Press and printers of The Saturday Quadrant' }, { timeout: 10_000 }));
    const group = await screen.findByRole('group', { name: /They alone see, download and decide this publication's proofs/ });
    const demoPrinter = demo.printers.items[0]!;
    const ticked = within(group).getByRole('checkbox', { name: `${demoPrinter.name} (${demoPrinter.email})` }) as HTMLInputElement;
    const other = within(group).getByRole('checkbox', { name: `${second.name} (${second.email})` }) as HTMLInputElement;
    expect([ticked.checked, other.checked]).toEqual([true, false]);
    await user.click(ticked);
    await user.click(other);
    await user.click(screen.getByRole('button', { name: 'Save printers' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PUT').map((c) => [c.path, c.body])).toEqual([[`/api/publications/${quadrant.id}/printers`, { userIds: [second.id] }]]));
    expect(await screen.findByText('Printers saved.')).toBeTruthy();
  });
});
