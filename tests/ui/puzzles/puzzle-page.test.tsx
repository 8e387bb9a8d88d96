import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { puzzleDetailSchema, type PuzzleDetail } from '../../../shared/contracts/puzzles';
import { verifyTiling } from '../../../shared/tiling/index';
import { order9Tiling } from '../../fixtures/order9';
import { meAs, renderApp, stubFetch } from '../app/render-app';

// The workbench of one puzzle against a stubbed API. The tiling is the published order-9
// rectangle 33 x 32, code (18,15)(7,8)(14,4)(10,1)(9) (squaring.net catalogue; MathWorld
// credits Moron 1925), with the placements of that code (tests/fixtures/order9).
const tiling = order9Tiling;

const base: PuzzleDetail = puzzleDetailSchema.parse({
  id: 5, kind: 'deduction', title: 'Deduction, 9 squares', status: 'unique', grade: 2, level: 2, stockId: 3,
  tilingKey: '33x32:18,15,7,8,14,4,10,1,9', order: 9, width: 33, height: 32, certificateCurrent: true, usedIn: [],
  createdAt: '2026-12-02T01:00:00.000Z', updatedAt: '2026-12-02T01:00:00.000Z', showFrame: false, tiling,
  starters: [], givens: [{ x: 0, y: 0, size: 18 }, { x: 18, y: 0, size: 15 }],
  steps: [{ square: 4, label: 'E', round: 1, value: 14, text: 'E = 32 − 18 = 14' }],
  certificate: { kind: 'deduction', verdict: 'unique', inputHash: 'a'.repeat(64), engineVersion: 'puzzle-engine/1', checks: ['rank 18 of 18 unknowns'], counts: { classes: 1, rank: 18, unknowns: 18 }, nodes: 7, ms: 2.5, createdAt: '2026-12-02T01:00:00.000Z' },
  staleReasons: [], second: null, notes: [], lastRecheck: null,
  job: { id: 'j1', state: 'done', phase: null, done: null, total: null, elapsedMs: 12, error: null },
});

describe('the puzzle workbench', () => {
  it('shows the verdict, toggles givens on the drawing and proves again with exactly the chosen squares', async () => {
    expect(verifyTiling(tiling).ok).toBe(true);
    let current = base;
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/puzzles/5': () => ({ body: current }),
      'PATCH /api/puzzles/5': (call) => {
        current = { ...base, status: 'proving', certificateCurrent: false, staleReasons: ['a new proof is running'], job: { id: 'j2', state: 'running', phase: 'choosing givens', done: 3, total: null, elapsedMs: 40, error: null } };
        return { status: 202, body: { id: 5, jobId: 'j2', echo: call.body } };
      },
    });
    renderApp('/puzzles/5');
    const verdict = await screen.findByRole('region', { name: 'Verdict' }, { timeout: 10_000 });
    expect(within(verdict).getByText('Unique')).toBeTruthy();
    expect(within(verdict).getByText('Certificate current: printable')).toBeTruthy();
    const squares = screen.getByRole('group', { name: /Squares: press one/ });
    const boxes = within(squares).getAllByRole('checkbox');
    expect(boxes).toHaveLength(9);
    expect(boxes.filter((b) => b.getAttribute('aria-checked') === 'true')).toHaveLength(2);
    // take out the 15, add the 14 (keyboard)
    await userEvent.click(within(squares).getByRole('checkbox', { name: /size 15,/ }));
    within(squares).getByRole('checkbox', { name: /size 14,/ }).focus();
    await userEvent.keyboard(' ');
    expect(screen.getByText('2 givens chosen (not yet proved)')).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Prove again' }));
    await expect.poll(() => calls.find((c) => c.method === 'PATCH')?.body).toEqual({ givens: [{ x: 0, y: 0 }, { x: 0, y: 18 }] });
    expect(await within(verdict).findByRole('progressbar', { name: 'Proving uniqueness' })).toBeTruthy();
  });

  it('shows why a stale puzzle cannot print, and the steps in the solution preview', async () => {
    stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/puzzles/5': { body: { ...base, status: 'not-unique', certificateCurrent: false, staleReasons: ['the givens leave some sizes free: not unique'] } },
    });
    renderApp('/puzzles/5');
    const alert = await screen.findByText('This puzzle cannot go into an edition yet', undefined, { timeout: 10_000 });
    expect(alert.parentElement?.textContent).toMatch(/not unique/);
    await userEvent.click(screen.getByRole('tab', { name: 'Solution' }));
    expect(within(screen.getByRole('list', { name: 'Steps' })).getByText('E = 32 − 18 = 14')).toBeTruthy();
  });
});
