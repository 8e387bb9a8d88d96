import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { meAs, renderApp, stubFetch } from '../app/render-app';

// The setters' Earnings screen against stubbed answers shaped by shared/contracts/payouts.ts.

const entry = {
  id: 'le-1', kind: 'fee', setterId: 'u-setter', editionId: 'ed-1', publicationId: 'pub-1', puzzleId: 'pz-1', puzzleKind: 'deduction',
  amountMinor: 6000, currency: 'GBP', date: '2026-11-21', reason: null, correctsEntryId: null, createdAt: '2026-11-21T08:00:00.000Z',
};
const earnings = {
  month: '2026-12',
  entries: [entry],
  statements: [{ month: '2026-11', entryCount: 1, totals: [{ currency: 'GBP', amountMinor: 6000 }] }],
  payouts: [{ id: 'po-1', runId: 'r1', setterId: 'u-setter', setterName: 'Demo setter', amountMinor: 6000, currency: 'GBP', state: 'paid', attempt: 1, failureMessage: null, createdAt: '2026-11-30T10:00:00.000Z', updatedAt: '2026-11-30T10:00:02.000Z', paidAt: '2026-11-30T10:00:02.000Z' }],
  owed: [],
  details: null,
};

describe('Earnings page', () => {
  it('shows entries, the paid payout, the tax note and a CSV link; mails a statement on request', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('setter'),
      'GET /api/earnings': { body: earnings },
      'POST /api/earnings/statements/2026-11/send': { body: { month: '2026-11', to: 'setter@demo.squarewright.test', queued: true } },
    });
    const user = userEvent.setup();
    renderApp('/earnings');
    expect(await screen.findByText('Fee: Deduction puzzle printed')).toBeTruthy();
    expect(screen.getByText('Paid')).toBeTruthy();
    expect(screen.getByText(/declaring this income is your responsibility/)).toBeTruthy();
    const csv = screen.getByRole('link', { name: 'Download the statement for November 2026 as CSV' });
    expect(csv.getAttribute('href')).toBe('/api/earnings/statements/2026-11.csv');
    await user.click(screen.getByRole('button', { name: 'Mail me the statement for November 2026' }));
    expect(await screen.findByText(/on its way to setter@demo.squarewright.test/)).toBeTruthy();
    expect(calls.some((c) => c.method === 'POST' && c.path === '/api/earnings/statements/2026-11/send')).toBe(true);
  });

  it('asks the server for a provider link with the chosen country, and shows its refusal', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('setter'),
      'GET /api/earnings': { body: earnings },
      'POST /api/earnings/payout-details': { status: 503, body: { error: { code: 'internal', message: 'The payments provider did not accept the request' } } },
    });
    const user = userEvent.setup();
    renderApp('/earnings');
    const form = (await screen.findByLabelText('Country of your bank account')).closest('form');
    if (!form) throw new Error('no form');
    await user.selectOptions(within(form).getByLabelText('Country of your bank account'), 'NL');
    await user.click(within(form).getByRole('button', { name: 'Add payout details' }));
    await waitFor(() => expect(calls.find((c) => c.path === '/api/earnings/payout-details')?.body).toEqual({ country: 'NL' }));
    expect((await screen.findByRole('alert')).textContent).toContain('did not accept the request');
  });
});
