import Stripe from 'stripe';
import { newId, nowSec } from './ids';
import { FAKE_SECRET_KEY, type PaymentsFakeStats } from './types';

// The fake's webhooks: an event envelope like the provider's, signed with the endpoint
// secret by the SDK's own `webhooks.generateTestHeaderString` (so our receiver verifies it
// exactly as it verifies the real provider's), delivered in the background with up to
// three attempts. settleAll() and stop() wait for the deliveries in flight.

export type WebhookSender = {
  setUrl(url: string): void;
  /** Queues the delivery of one event about `object` (of a connected `account`, if given). */
  send(type: string, object: object, account?: string): void;
  /** Resolves when no delivery is in flight (including ones queued meanwhile). */
  drain(): Promise<void>;
  /** Waits for the deliveries in flight, whatever their outcome. */
  settle(): Promise<void>;
};

export function createWebhookSender(options: { secret: string; url: string | undefined; stats: PaymentsFakeStats; log: (line: string) => void }): WebhookSender {
  const { secret, stats, log } = options;
  const signer = new Stripe(FAKE_SECRET_KEY);
  const deliveries = new Set<Promise<void>>();
  let url = options.url;

  async function deliver(target: string, type: string, payload: string): Promise<void> {
    for (let attempt = 1; attempt <= 3; attempt++) {
      try {
        const header = signer.webhooks.generateTestHeaderString({ payload, secret });
        const res = await fetch(target, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload });
        if (res.ok) {
          stats.webhooksDelivered++;
          log(`webhook ${type} delivered`);
          return;
        }
        log(`webhook ${type} answered ${res.status}`);
      } catch (error) {
        log(`webhook ${type} not delivered: ${error instanceof Error ? error.message : String(error)}`);
      }
      await new Promise((r) => setTimeout(r, 100 * attempt));
    }
    stats.webhooksFailed++;
  }

  return {
    setUrl: (next) => {
      url = next;
    },
    send: (type, object, account) => {
      if (!url) return;
      const event = {
        id: newId('evt'),
        object: 'event',
        api_version: Stripe.API_VERSION,
        created: nowSec(),
        type,
        livemode: false,
        pending_webhooks: 1,
        request: { id: null, idempotency_key: null },
        data: { object },
        ...(account ? { account } : {}),
      };
      const p = deliver(url, type, JSON.stringify(event)).finally(() => deliveries.delete(p));
      deliveries.add(p);
    },
    drain: async () => {
      while (deliveries.size > 0) await Promise.all(deliveries);
    },
    settle: async () => {
      await Promise.allSettled(deliveries);
    },
  };
}
