import { randomBytes } from 'node:crypto';
import { isAbsolute, join, resolve } from 'node:path';
import { appRoot } from '../../platform/app-root';
import type { MoneyDeps } from './ports';
import type { Env } from '../../platform/env';
import { FAKE_SECRET_KEY, startPaymentsFake } from './fake-provider/index';
import type { PayoutsDeps, StatementDeps } from './payouts';
import type { LocalFake } from '../../platform/local-fake';
import { createPaymentsProvider, type PaymentsProvider } from './provider';

// How the server gets its payments provider. With PAYMENTS_SECRET_KEY: the real provider.
// Without it, `npm start`, `npm run dev` and the tests start the local fake (below), which
// sets PAYMENTS_API_URL and PAYMENTS_WEBHOOK_SECRET for the app. Either way the same SDK
// client is used; only its host differs.

export const webhookPath = '/api/payments/webhook';

export type PaymentsEnv = Pick<Env, 'PAYMENTS_SECRET_KEY' | 'PAYMENTS_WEBHOOK_SECRET' | 'PAYMENTS_API_URL'>;

/** The provider the environment asks for, or null when payments are not configured. Throws on a half-configured real provider. */
export function paymentsProviderFromEnv(env: PaymentsEnv): PaymentsProvider | null {
  if (env.PAYMENTS_SECRET_KEY) {
    if (!env.PAYMENTS_WEBHOOK_SECRET) {
      throw new Error('PAYMENTS_WEBHOOK_SECRET must be set when PAYMENTS_SECRET_KEY is (the signing secret of the webhook endpoint at the provider)');
    }
    return createPaymentsProvider({ secretKey: env.PAYMENTS_SECRET_KEY, webhookSecret: env.PAYMENTS_WEBHOOK_SECRET });
  }
  if (env.PAYMENTS_API_URL && env.PAYMENTS_WEBHOOK_SECRET) {
    const url = new URL(env.PAYMENTS_API_URL);
    return createPaymentsProvider({ secretKey: FAKE_SECRET_KEY, webhookSecret: env.PAYMENTS_WEBHOOK_SECRET, local: { host: url.hostname, port: Number(url.port) } });
  }
  return null;
}

/** The local fake provider, for the list in server/local-fakes.ts. */
export const localPaymentsFake: LocalFake = {
  name: 'payments',
  shouldStart: (env) => !env.PAYMENTS_SECRET_KEY && !env.PAYMENTS_API_URL,
  start: async ({ env, log }) => {
    const webhookSecret = env.PAYMENTS_WEBHOOK_SECRET ?? `whsec_local_${randomBytes(18).toString('hex')}`;
    const fake = await startPaymentsFake({
      webhookSecret,
      webhookUrl: `${env.PUBLIC_URL}${webhookPath}`,
      settleDelayMs: 1_500,
      // Kept beside the database, so a restarted server still finds its accounts and keys.
      stateFile: join(isAbsolute(env.DATA_DIR) ? env.DATA_DIR : resolve(appRoot(), env.DATA_DIR), 'payments-fake.json'),
      log: (line) => log.debug(`payments fake: ${line}`),
    });
    return {
      url: fake.url,
      stop: () => fake.stop(),
      envOverrides: { PAYMENTS_API_URL: fake.url, PAYMENTS_WEBHOOK_SECRET: webhookSecret },
    };
  },
};

/** What the statements need from the app's dependencies. */
export function statementDepsFrom(deps: MoneyDeps): StatementDeps {
  return { db: deps.db, clock: deps.clock, publicUrl: deps.env.PUBLIC_URL, kickMail: () => deps.mail.kick() };
}

/** The payout service's dependencies from the app's. */
export function payoutsDepsFrom(deps: MoneyDeps, provider: PaymentsProvider): PayoutsDeps {
  return { ...statementDepsFrom(deps), provider, log: deps.log, events: deps.events };
}
