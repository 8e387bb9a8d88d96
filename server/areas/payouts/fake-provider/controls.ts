import { accountById, finishOnboarding } from './accounts';
import type { FakeContext } from './context';
import { jsonAnswer, type Answer } from './http-server';
import { paidOutTo, type Settlement } from './money';
import { balanceOf } from './state';
import type { PaymentsFake } from './types';

// The fake's switches and readings for tests, the demo and browser sessions: failures on
// demand, finishing onboarding without the page, settling now, what was created and paid.
// The same switches over HTTP under /__fake/ (for a browser session against `npm run dev`).

export type FakeControls = Omit<PaymentsFake, 'host' | 'port' | 'url' | 'secretKey' | 'stop'>;

export function fakeControls(ctx: FakeContext, settlement: Settlement): FakeControls {
  const { failures } = ctx;
  return {
    setWebhookUrl: (url) => ctx.webhooks.setUrl(url),
    failTransfersFor: (id, message = 'The destination account cannot receive transfers (test failure).') => {
      failures.transfers.set(id, message);
    },
    failPayoutsFor: (id, message = 'The bank account has been closed (test failure).') => {
      failures.payouts.set(id, message);
    },
    clearFailures: (id) => {
      failures.transfers.delete(id);
      failures.payouts.delete(id);
    },
    failNextRequest: (method, path) => {
      failures.nextRequest.add(`${method.toUpperCase()} ${path}`);
    },
    completeOnboarding: (id) => {
      finishOnboarding(accountById(ctx.state, id));
      ctx.save();
    },
    settleAll: () => settlement.settleAll(),
    stats: () => structuredClone(ctx.stats),
    paidOutTo: (id) => paidOutTo(ctx.state, id),
    balanceOf: (id) => Object.fromEntries(balanceOf(ctx.state, id)),
  };
}

/** The control endpoints: GET /__fake/stats, POST /__fake/settle, POST /__fake/accounts/:id/<switch>. Null for any other path. */
export function controlAnswer(controls: FakeControls, method: string, path: string): Answer | Promise<Answer> | null {
  if (method === 'GET' && path === '/__fake/stats') return jsonAnswer(200, JSON.stringify(controls.stats()));
  if (method === 'POST' && path === '/__fake/settle') return controls.settleAll().then(() => jsonAnswer(200, JSON.stringify({ settled: true })));
  const m = method === 'POST' ? path.match(/^\/__fake\/accounts\/(\w+)\/(fail-payouts|fail-transfers|clear-failures|complete-onboarding)$/) : null;
  if (!m) return null;
  const [, id = '', action] = m;
  if (action === 'fail-payouts') controls.failPayoutsFor(id);
  else if (action === 'fail-transfers') controls.failTransfersFor(id);
  else if (action === 'complete-onboarding') controls.completeOnboarding(id);
  else controls.clearFailures(id);
  return jsonAnswer(200, JSON.stringify({ ok: true }));
}
