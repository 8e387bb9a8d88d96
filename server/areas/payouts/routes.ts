import { ledgerCorrectionInputSchema, ledgerCorrectionResponseSchema } from '../../../shared/contracts/ledger';
import { createPayoutRunInputSchema, createPayoutRunResponseSchema, payoutIdParamsSchema, payoutResponseSchema, payoutsOverviewSchema } from '../../../shared/contracts/payouts';
import type { MoneyDeps } from './ports';
import { route, type ApiRouter } from '../../platform/http/route';
import { recordCorrection } from './ledger';
import { createPayoutRun, payoutsOverview, retryPayout } from './payouts';
import { registerEarningsRoutes } from './earnings-routes';
import { moneyErrors, payoutsDepsOrFail, startPayoutRecovery } from './payments-common';
import { registerPaymentsWebhookRoutes } from './webhook-routes';

// Editors: what is owed, payout runs and their results, ledger corrections.

export function registerPayoutRoutes(router: ApiRouter, deps: MoneyDeps) {
  startPayoutRecovery(deps);

  route(router, { method: 'GET', path: '/api/payouts', summary: 'Owed per setter, payout runs and their payouts', tags: ['payouts'], response: payoutsOverviewSchema }, () =>
    moneyErrors(() => payoutsOverview(deps.db)),
  );

  route(
    router,
    {
      method: 'POST',
      path: '/api/payouts/runs',
      summary: 'Pay every setter owed (or those named) through the payments provider; the same requestKey never pays twice',
      tags: ['payouts'],
      body: createPayoutRunInputSchema,
      response: createPayoutRunResponseSchema,
      status: 201,
    },
    ({ body, user }) => moneyErrors(() => createPayoutRun(payoutsDepsOrFail(deps), user.id, body)),
  );

  route(
    router,
    { method: 'POST', path: '/api/payouts/:id/retry', summary: 'Retry a failed payout (a new attempt)', tags: ['payouts'], params: payoutIdParamsSchema, response: payoutResponseSchema },
    async ({ params }) => ({ payout: await moneyErrors(() => retryPayout(payoutsDepsOrFail(deps), params.id)) }),
  );

  route(
    router,
    {
      method: 'POST',
      path: '/api/ledger/corrections',
      summary: 'Add a correction to a setter\'s ledger (a new entry; entries are never edited)',
      tags: ['payouts'],
      body: ledgerCorrectionInputSchema,
      response: ledgerCorrectionResponseSchema,
      status: 201,
    },
    ({ body, user }) => moneyErrors(() => ({ entry: deps.db.transaction((tx) => recordCorrection(tx, body, user.id, deps.clock.now())) })),
  );
}

/** The whole money area (payouts, earnings, the provider's webhook): the one line in server/area-routes.ts. */
export function registerMoneyRoutes(router: ApiRouter, deps: MoneyDeps) {
  registerPayoutRoutes(router, deps);
  registerEarningsRoutes(router, deps);
  registerPaymentsWebhookRoutes(router, deps);
}
