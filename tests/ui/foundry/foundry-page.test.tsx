import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import type { Run } from '../../../shared/contracts/foundry';
import { meAs, renderApp, stubFetch } from '../app/render-app';

const running: Run = {
  id: '11111111-1111-4111-8111-111111111111',
  state: 'running',
  params: { mode: 'exhaustive', order: 16, squaresOnly: false, includeImperfect: false },
  progress: { phase: 'graphs solved', done: 412, total: 1342, found: 2700, rate: 310.5, etaMs: 3000, elapsedMs: 1400 },
  summary: null,
  error: null,
  found: 2700,
  foundPerfect: 2500,
  foundImperfect: 200,
  addedToStock: 2450,
  retry: { resume: false, restart: false },
  createdAt: '2026-12-02T01:00:00.000Z',
  startedAt: '2026-12-02T01:00:01.000Z',
  finishedAt: null,
};

describe('the foundry page', () => {
  it('shows a running run with its progress bar, rate, time left and a cancel button', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/foundry/runs': { body: { items: [running] } },
      [`POST /api/foundry/runs/${running.id}/cancel`]: { body: { ...running, state: 'cancelled' } },
    });
    renderApp('/foundry');
    const bar = await screen.findByRole('progressbar', { name: 'Exhaustive, order 16' }, { timeout: 10_000 }); // the page is a lazy route
    expect(bar.getAttribute('aria-valuenow')).toBe(String(Math.round((412 / 1342) * 100)));
    expect(bar.getAttribute('aria-valuetext')).toMatch(/412 of 1,342 graphs solved · 310.5 \/s · 3 s left · 2,700 tilings found: 2,500 perfect and 200 imperfect/);
    const row = screen.getByRole('row', { name: `Run ${running.id}` });
    await userEvent.click(within(row).getByRole('button', { name: 'Cancel' }));
    await expect.poll(() => calls.some((c) => c.method === 'POST' && c.path.endsWith('/cancel'))).toBe(true);
  });

  it('offers Resume and Restart for a run the server stopped, and sends the choice', async () => {
    const interrupted: Run = { ...running, state: 'interrupted', retry: { resume: true, restart: true }, finishedAt: '2026-12-02T01:00:09.000Z' };
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/foundry/runs': { body: { items: [interrupted, { ...running, id: '22222222-2222-4222-8222-222222222222', state: 'done', retry: { resume: false, restart: false } }] } },
      [`POST /api/foundry/runs/${running.id}/retry`]: { body: { ...running, state: 'queued', progress: null } },
    });
    renderApp('/foundry');
    const row = await screen.findByRole('row', { name: `Run ${running.id}` }, { timeout: 10_000 });
    expect(within(row).getByText('Interrupted')).toBeTruthy();
    expect(within(row).queryByRole('button', { name: 'Cancel' })).toBeNull();
    // a finished run offers neither
    const done = screen.getByRole('row', { name: 'Run 22222222-2222-4222-8222-222222222222' });
    expect(within(done).queryByRole('button', { name: /Resume|Restart/ })).toBeNull();
    expect(within(row).getByRole('button', { name: `Restart run ${running.id}` })).toBeTruthy();
    await userEvent.click(within(row).getByRole('button', { name: `Resume run ${running.id}` }));
    await expect.poll(() => calls.find((c) => c.method === 'POST' && c.path.endsWith('/retry'))?.body).toEqual({ how: 'resume' });
  });

  it('checks the parameters with the shared contract before sending anything', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/foundry/runs': { body: { items: [] } },
      'POST /api/foundry/runs': (call) => ({ status: 201, body: { ...running, state: 'queued', progress: null, found: 0, addedToStock: 0, params: call.body } }),
    });
    renderApp('/foundry');
    const form = await screen.findByRole('form', { name: 'Start a foundry run' }, { timeout: 10_000 });
    await userEvent.selectOptions(within(form).getByLabelText('Mode'), 'random');
    await userEvent.clear(within(form).getByLabelText('Smallest order'));
    await userEvent.type(within(form).getByLabelText('Smallest order'), '20');
    await userEvent.clear(within(form).getByLabelText('Largest order'));
    await userEvent.type(within(form).getByLabelText('Largest order'), '12');
    await userEvent.click(within(form).getByRole('button', { name: 'Start run' }));
    expect(await within(form).findByText('orderMax must be at least orderMin')).toBeTruthy();
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await userEvent.selectOptions(within(form).getByLabelText('Mode'), 'exhaustive');
    await userEvent.clear(within(form).getByLabelText(/Order/));
    await userEvent.type(within(form).getByLabelText(/Order/), '9');
    await userEvent.click(within(form).getByRole('button', { name: 'Start run' }));
    await expect.poll(() => calls.find((c) => c.method === 'POST')?.body).toEqual({ mode: 'exhaustive', order: 9, squaresOnly: false, includeImperfect: false });
  });
});
