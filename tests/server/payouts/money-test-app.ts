import http from 'node:http';
import type TestAgent from 'supertest/lib/agent';
import { eq } from 'drizzle-orm';
import { payoutAccount } from '../../../server/schema';
import { startPaymentsFake, type PaymentsFake } from '../../../server/areas/payouts/fake-provider/index';
import { closeServer, listenOnLoopback } from '../../../server/areas/payouts/fake-provider/http-server';
import { payoutsDepsFrom } from '../../../server/areas/payouts/runtime';
import { recordPublicationFees } from '../../../server/areas/payouts/ledger';
import type { PayoutsDeps } from '../../../server/areas/payouts/payouts';
import { createTestApp, type CreateTestAppOptions, type TestApp } from '../helpers/test-app';

// A test app wired to its own local fake provider, listening on a random port so the
// fake's signed webhooks reach it. Payouts settle only when a test calls fake.settleAll().

export const testWebhookSecret = 'whsec_test_squarewright_0123456789abcdef';

export type MoneyTestApp = TestApp & {
  fake: PaymentsFake;
  baseUrl: string;
  payoutsDeps(extra?: Partial<PayoutsDeps>): PayoutsDeps;
  /** A setter signed in (created on first use; email `${first name}@test.squarewright.test` unless given). */
  newSetter(name: string, email?: string): Promise<{ agent: TestAgent; id: string; email: string }>;
  /** Writes fee entries as the publish step would (its own transaction here). */
  seedFees(setterId: string, amounts: number[], options?: { editionId?: string; currency?: string; date?: string }): void;
  /** Gives a setter finished payout details at the fake; returns the provider account id. */
  onboard(agent: TestAgent, setterId: string): Promise<string>;
  closeAll(): Promise<void>;
};

let editionCounter = 0;

export async function createMoneyTestApp(options: { demo?: CreateTestAppOptions['demo']; settleDelayMs?: number } = {}): Promise<MoneyTestApp> {
  const fake = await startPaymentsFake({
    webhookSecret: testWebhookSecret,
    ...(options.settleDelayMs !== undefined ? { settleDelayMs: options.settleDelayMs } : { autoSettle: false }),
  });
  const t = await createTestApp({
    env: { PAYMENTS_API_URL: fake.url, PAYMENTS_WEBHOOK_SECRET: testWebhookSecret },
    ...(options.demo !== undefined ? { demo: options.demo } : {}),
  });
  const server = http.createServer(t.app);
  const { url: baseUrl } = await listenOnLoopback(server);
  fake.setWebhookUrl(`${baseUrl}/api/payments/webhook`);
  const provider = t.deps.payments;
  if (!provider) throw new Error('the test app has no payments provider');
  return {
    ...t,
    fake,
    baseUrl,
    payoutsDeps: (extra = {}) => ({ ...payoutsDepsFrom(t.deps, provider), ...extra }),
    async newSetter(name, email = `${name.toLowerCase()}@test.squarewright.test`) {
      const agent = await t.signInAs('setter', { email, name });
      const id = await t.createUser('setter', { email });
      return { agent, id, email };
    },
    seedFees(setterId, amounts, options = {}) {
      const editionId = options.editionId ?? `edition-${++editionCounter}`;
      t.db.transaction((tx) =>
        recordPublicationFees(tx, {
          editionId,
          publicationId: 'saturday-quadrant',
          date: options.date ?? '2026-11-14',
          entries: amounts.map((amountMinor, i) => ({ puzzleId: `${editionId}-p${i + 1}`, setterId, kind: i % 2 ? 'deduction' : 'assembly', amountMinor, currency: options.currency ?? 'GBP' })),
        }),
      );
    },
    async onboard(agent, setterId) {
      const res = await agent.post('/api/earnings/payout-details').send({ country: 'GB' });
      if (res.status !== 200) throw new Error(`payout-details: ${res.status} ${JSON.stringify(res.body)}`);
      const row = t.db.select({ id: payoutAccount.providerAccountId }).from(payoutAccount).where(eq(payoutAccount.setterId, setterId)).get();
      if (!row) throw new Error('no payout account stored');
      fake.completeOnboarding(row.id);
      await agent.get('/api/earnings').expect(200);
      return row.id;
    },
    async closeAll() {
      await fake.stop();
      await closeServer(server);
      await t.close();
    },
  };
}
