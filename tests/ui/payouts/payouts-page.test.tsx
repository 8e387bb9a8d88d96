import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { meAs, renderApp, stubFetch } from '../app/render-app';

// The editors' Payouts screen against stubbed answers shaped by shared/contracts/payouts.ts.

const owed = [
  { setterId: 's1', setterName: 'Selma Quist', email: 'setter@demo.squarewright.test', currency: 'GBP', owedMinor: 14_500, detailsStatus: 'ready', detailsHint: 'Fake Test Bank ending 6789' },
  { setterId: 's2', setterName: 'Noor Vale', email: 'noor@demo.squarewright.test', currency: 'GBP', owedMinor: 900, detailsStatus: null, detailsHint: null },
];
const failedPayout = {
  id: 'po-1', runId: 'run-1', setterId: 's3', setterName: 'Tobias Wren', amountMinor: 11_500, currency: 'GBP', state: 'failed', attempt: 1,
  failureMessage: 'The bank account has been closed (test failure).', createdAt: '2026-11-30T10:00:00.000Z', updatedAt: '2026-11-30T10:00:01.000Z', paidAt: null,
};
const runs = [{ id: 'run-1', createdAt: '2026-11-30T10:00:00.000Z', createdByName: 'Edwin Thorne', payouts: [failedPayout] }];

describe('Payouts page', () => {
  it('lists what is owed and the runs, and runs a payout with one request key for the setters who can be paid', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/payouts': { body: { owed, runs } },
      'POST /api/payouts/runs': () => ({
        status: 201,
        body: { replayed: false, skipped: [], run: { id: 'run-2', createdAt: '2026-12-01T10:00:00.000Z', createdByName: 'Edwin Thorne', payouts: [{ ...failedPayout, id: 'po-2', runId: 'run-2', setterId: 's1', setterName: 'Selma Quist', amountMinor: 14_500, state: 'pending', failureMessage: null }] } },
      }),
    });
    const user = userEvent.setup();
    renderApp('/payouts');
    const selma = await screen.findByRole('row', { name: /Selma Quist/ });
    expect(within(selma).getByText('£145.00')).toBeTruthy();
    expect(within(screen.getByRole('row', { name: /Noor Vale/ })).getByText('No payout details')).toBeTruthy();
    const failedRow = screen.getByRole('row', { name: /Tobias Wren/ });
    expect(within(failedRow).getByText('Failed')).toBeTruthy();
    expect(within(failedRow).getByText(/bank account has been closed/)).toBeTruthy();
    expect(screen.getAllByText(/subject to local tax rules/).length).toBeGreaterThan(0);

    await user.click(screen.getByRole('button', { name: 'Run a payout…' }));
    const dialog = await screen.findByRole('dialog', { name: 'Run a payout' });
    expect(within(dialog).queryByText('Noor Vale')).toBeNull();
    await user.click(within(dialog).getByRole('button', { name: 'Pay £145.00' }));
    expect(await screen.findByText(/1 payout sent to the provider \(£145\.00\)/)).toBeTruthy();
    const sent = calls.filter((c) => c.method === 'POST' && c.path === '/api/payouts/runs');
    expect(sent).toHaveLength(1);
    const body = sent[0]?.body as { requestKey: string; setterIds: string[] };
    expect(body.setterIds).toEqual(['s1']);
    expect(body.requestKey).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  });

  it('retries a failed payout', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/payouts': { body: { owed: [], runs } },
      'POST /api/payouts/po-1/retry': { body: { payout: { ...failedPayout, state: 'pending', attempt: 2, failureMessage: null } } },
    });
    const user = userEvent.setup();
    renderApp('/payouts');
    await user.click(await screen.findByRole('button', { name: 'Retry the payout to Tobias Wren' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST' && c.path === '/api/payouts/po-1/retry')).toBe(true));
    expect(screen.getByRole('button', { name: 'Run a payout…' }).hasAttribute('disabled')).toBe(true);
  });
});
