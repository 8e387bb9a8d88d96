import { z } from 'zod';
import { monthSchema, statementSchema, statementSendResponseSchema } from '../../../shared/contracts/ledger';
import { earningsSchema, payoutDetailsInputSchema, payoutDetailsResponseSchema } from '../../../shared/contracts/payouts';
import type { MoneyDeps } from './ports';
import { route, type ApiRouter } from '../../platform/http/route';
import { buildStatement, editionNamesOf, statementCsv } from './ledger';
import { earningsOf, refreshPayoutDetails, sendStatement, startPayoutDetails } from './payouts';
import { moneyErrors, payoutsDepsOrFail } from './payments-common';
import { statementDepsFrom } from './runtime';

// Setters: their own entries, monthly statements (screen, CSV, mail), payouts and payout
// details. A setter only ever sees their own (the id comes from the session).

const monthParams = z.object({ month: monthSchema }).strict();

export function registerEarningsRoutes(router: ApiRouter, deps: MoneyDeps) {
  route(router, { method: 'GET', path: '/api/earnings', summary: 'My ledger entries, statements, payouts and payout details', tags: ['earnings'], response: earningsSchema }, async ({ user }) => {
    if (deps.payments) await refreshPayoutDetails(payoutsDepsOrFail(deps), user.id);
    return earningsOf(deps.db, user.id, deps.clock.now());
  });

  // The .csv route first: '/:month' would otherwise take '2026-11.csv' as a month.
  route(
    router,
    { method: 'GET', path: '/api/earnings/statements/:month.csv', summary: 'My statement for one month as CSV', tags: ['earnings'], params: monthParams, produces: 'text/csv' },
    ({ params, user, res }) => {
      const csv = moneyErrors(() => {
        const statement = buildStatement(deps.db, user.id, params.month);
        return statementCsv(statement, editionNamesOf(deps.db, statement));
      });
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="squarewright-statement-${params.month}.csv"`);
      res.status(200).send(csv);
    },
  );

  route(
    router,
    { method: 'GET', path: '/api/earnings/statements/:month', summary: 'My statement for one month', tags: ['earnings'], params: monthParams, response: statementSchema },
    ({ params, user }) => moneyErrors(() => buildStatement(deps.db, user.id, params.month)),
  );

  route(
    router,
    { method: 'POST', path: '/api/earnings/statements/:month/send', summary: 'Mail me my statement for one month', tags: ['earnings'], params: monthParams, response: statementSendResponseSchema },
    ({ params, user }) => {
      const { to } = moneyErrors(() => sendStatement(statementDepsFrom(deps), user.id, params.month));
      return { month: params.month, to, queued: true };
    },
  );

  route(
    router,
    {
      method: 'POST',
      path: '/api/earnings/payout-details',
      summary: 'Create or continue my payout details at the payments provider (we keep only its account id)',
      tags: ['earnings'],
      body: payoutDetailsInputSchema,
      response: payoutDetailsResponseSchema,
    },
    ({ body, user }) => moneyErrors(() => startPayoutDetails(payoutsDepsOrFail(deps), user, body)),
  );
}
