import { z } from 'zod';
import type { MoneyDeps } from './ports';
import { BadRequest } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { applyProviderEvent } from './payouts';
import { ProviderEventUnreadable } from './provider';
import { payoutsDepsOrFail } from './payments-common';

// The payments provider's webhook. Public (the provider has no session) but every event
// must carry a valid signature over the raw body, and an event we act on must parse as
// the provider sends it; anything else is refused with 400, logged, and changes nothing.
// The raw body is kept by express.raw in server/app.ts.

const webhookAnswerSchema = z.object({ received: z.literal(true), result: z.enum(['applied', 'duplicate', 'ignored']) });

export function registerPaymentsWebhookRoutes(router: ApiRouter, deps: MoneyDeps) {
  route(
    router,
    { method: 'POST', path: '/api/payments/webhook', summary: 'Signed events from the payments provider (payout paid/failed, account updated)', tags: ['payouts'], response: webhookAnswerSchema },
    ({ req }) => {
      const payouts = payoutsDepsOrFail(deps);
      const raw: unknown = req.body;
      if (!Buffer.isBuffer(raw)) {
        deps.log.warn('payments webhook: refused, the raw body was not kept');
        throw new BadRequest('The webhook body must be the raw JSON the provider signed.');
      }
      const signature = req.headers['stripe-signature'];
      let parsed;
      try {
        parsed = payouts.provider.parseWebhook(raw, typeof signature === 'string' ? signature : undefined);
      } catch (error) {
        if (error instanceof ProviderEventUnreadable) {
          deps.log.warn(`payments webhook: refused, ${error.message}`);
          throw new BadRequest('The webhook event is not in the form the provider sends for its type; nothing was applied.');
        }
        deps.log.warn(`payments webhook: refused, bad signature (${(error as Error).message.split('\n')[0]})`);
        throw new BadRequest('The webhook signature is not valid.');
      }
      if (!parsed.event) {
        deps.log.debug(`payments webhook: ${parsed.type} ${parsed.id} ignored`);
        return { received: true as const, result: 'ignored' as const };
      }
      const result = applyProviderEvent(payouts, parsed.event);
      deps.log.info(`payments webhook: ${parsed.type} ${parsed.id} ${result}`);
      return { received: true as const, result };
    },
  );
}
