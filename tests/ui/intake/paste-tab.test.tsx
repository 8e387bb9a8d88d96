import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { canonicalCode, canonicalKey, classifyTiling, parseTiling, toBouwkamp } from '../../../shared/tiling/index';
import type { Verdict } from '../../../shared/contracts/tilings';
import { PasteTab } from '../../../src/features/submit/components/paste-tab';
import { order9Code } from '../../fixtures/order9';

/** The verdict the server gives, built here from the same engine (the server test checks the route itself). */
function verdictFor(code: string): Verdict {
  const t = parseTiling(code);
  const c = classifyTiling(t);
  return {
    valid: true,
    order: c.order,
    width: t.W,
    height: t.H,
    square: c.square,
    perfect: c.perfect,
    simple: c.simple,
    bouwkamp: toBouwkamp(t, { header: true }),
    canonicalCode: canonicalCode(t),
    canonicalKey: canonicalKey(t),
    classification: { ...c, subRectangles: c.subRectangles },
    tiling: t,
    smith: null,
    duplicate: false,
    duplicateOf: null,
  };
}

type Call = { method: string; path: string; body: unknown };
function stub(answer: (call: Call) => { status: number; body: unknown }) {
  const calls: Call[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: unknown, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost:3000');
      const call = { method: init?.method ?? 'GET', path: url.pathname, body: init?.body ? JSON.parse(String(init.body)) : undefined };
      calls.push(call);
      const a = answer(call);
      return new Response(JSON.stringify(a.body), { status: a.status, headers: { 'content-type': 'application/json' } });
    }),
  );
  return calls;
}

function renderTab() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter>
        <PasteTab />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('Submit: paste code', () => {
  it('shows the drawing and the verdict of a valid code once typing stops, and submits it', async () => {
    const calls = stub((call) => {
      if (call.path === '/api/tilings/check') return { status: 200, body: verdictFor((call.body as { code: string }).code) };
      if (call.path === '/api/submissions') {
        return {
          status: 201,
          body: {
            id: 7, setterId: 'u1', setterName: 'Demo', title: 'Mine', note: null, source: 'paste', code: order9Code,
            canonicalCode: order9Code, canonicalKey: '33x32:18,15,7,8,14,4,10,1,9', width: 33, height: 32, order: 9,
            square: false, perfect: true, simple: true, status: 'pending', duplicateOf: null, sameAs: null, editorNote: null, stockId: null,
            createdAt: '2026-12-02T01:00:00.000Z', reviewedAt: null,
          },
        };
      }
      return { status: 404, body: { error: { code: 'not_found', message: 'no' } } };
    });
    const user = userEvent.setup();
    renderTab();
    const submit = screen.getByRole('button', { name: 'Submit for review' });
    expect(submit).toHaveProperty('disabled', true);
    await user.click(screen.getByLabelText('Bouwkamp or table code'));
    await user.paste(order9Code);
    // facts.md: the 33 x 32 rectangle of order 9 is simple and perfect
    expect(await screen.findByRole('img', { name: 'Squared rectangle 33 by 32 of 9 squares' }, { timeout: 3000 })).toBeTruthy();
    expect(screen.getByText('Valid tiling')).toBeTruthy();
    expect(screen.getByText('Perfect')).toBeTruthy();
    expect(screen.getByText('Simple')).toBeTruthy();
    // debounced: one check for the whole pasted code, not one per character
    expect(calls.filter((c) => c.path === '/api/tilings/check')).toHaveLength(1);
    await user.type(screen.getByLabelText('Title (optional)'), 'Mine');
    await waitFor(() => expect(submit).toHaveProperty('disabled', false));
    await user.click(submit);
    expect(await screen.findByText('Submitted')).toBeTruthy();
    expect(calls.find((c) => c.path === '/api/submissions')?.body).toEqual({ code: order9Code, source: 'paste', title: 'Mine' });
  });

  it('shows the precise error, with where, for a code that does not close', async () => {
    stub(() => ({
      status: 200,
      body: {
        valid: false,
        error: { code: 'too-wide', message: 'element 6 (size 5) is wider than the free segment (4) at x=14, y=18', where: { line: 1, column: 25, group: 3, element: 6 } },
      },
    }));
    const user = userEvent.setup();
    renderTab();
    await user.click(screen.getByLabelText('Bouwkamp or table code'));
    await user.paste('9 33 32 (18,15)(7,8)(14,5)(10,1)(9)');
    const alert = await screen.findByRole('alert', {}, { timeout: 3000 });
    expect(alert.textContent).toContain('This code does not make a tiling');
    expect(alert.textContent).toContain('element 6 (size 5) is wider than the free segment (4)');
    expect(alert.textContent).toContain('at line 1, column 25, group 3, element 6');
    expect(screen.getByRole('button', { name: 'Submit for review' })).toHaveProperty('disabled', true);
  });
});
