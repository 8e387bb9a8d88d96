import Stripe from 'stripe';
import { z } from 'zod';

// The payments provider, through its own SDK. Pointed at the local fake when no real key
// is configured (same SDK, same requests, another host). Only the calls we make are
// wrapped here, each answer parsed with zod, so the rest of the server never sees the
// SDK's types.

export type PaymentsConfig = {
  secretKey: string;
  webhookSecret: string;
  /** Set for the local fake: the SDK talks to http://host:port instead of the provider. */
  local?: { host: string; port: number };
};

/** A provider refusal (4xx): the operation did not happen and will not on a repeat. */
export class ProviderRefused extends Error {
  constructor(
    message: string,
    readonly code: string | undefined,
  ) {
    super(message);
    this.name = 'ProviderRefused';
  }
}

/** The provider could not be reached or had a fault (network, 5xx): try again later with the same key. */
export class ProviderUnavailable extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProviderUnavailable';
  }
}

const accountSchema = z.object({
  id: z.string(),
  details_submitted: z.boolean().optional(),
  payouts_enabled: z.boolean().optional(),
  external_accounts: z
    .object({ data: z.array(z.object({ last4: z.string().optional(), bank_name: z.string().nullable().optional() }).loose()) })
    .loose()
    .nullable()
    .optional(),
}).loose();

const providerPayoutSchema = z
  .object({
    id: z.string(),
    status: z.string(),
    amount: z.number().int(),
    currency: z.string(),
    failure_message: z.string().nullable().optional(),
    metadata: z.record(z.string(), z.string()).nullable().optional(),
  })
  .loose();
export type ProviderPayout = z.infer<typeof providerPayoutSchema>;

/** The webhook events we act on. */
const providerEventSchema = z.discriminatedUnion('type', [
  z.object({ id: z.string(), type: z.literal('payout.paid'), account: z.string().optional(), data: z.object({ object: providerPayoutSchema }) }).loose(),
  z.object({ id: z.string(), type: z.literal('payout.failed'), account: z.string().optional(), data: z.object({ object: providerPayoutSchema }) }).loose(),
  z.object({ id: z.string(), type: z.literal('account.updated'), account: z.string().optional(), data: z.object({ object: accountSchema }) }).loose(),
]);
export type ProviderEvent = z.infer<typeof providerEventSchema>;
const actedOnEventTypes: ReadonlySet<string> = new Set(providerEventSchema.options.map((o) => o.shape.type.value));

/** Any event has at least these; the events we do not act on are read no further. */
const eventEnvelopeSchema = z.object({ id: z.string(), type: z.string() }).loose();

/** A correctly signed webhook event that is not what the provider sends for its type (nothing is applied). */
export class ProviderEventUnreadable extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProviderEventUnreadable';
  }
}

/**
 * Reads a verified webhook event: an event we act on through its schema (one that does
 * not fit is a ProviderEventUnreadable naming the event, never skipped in silence), any
 * other type as `event: null`.
 */
export function readProviderEvent(verified: unknown): { id: string; type: string; event: ProviderEvent | null } {
  const envelope = eventEnvelopeSchema.safeParse(verified);
  if (!envelope.success) throw new ProviderEventUnreadable(`the event has no id or type:\n${z.prettifyError(envelope.error)}`);
  const { id, type } = envelope.data;
  if (!actedOnEventTypes.has(type)) return { id, type, event: null };
  const parsed = providerEventSchema.safeParse(verified);
  if (!parsed.success) throw new ProviderEventUnreadable(`event ${id} (${type}) is not what the provider sends:\n${z.prettifyError(parsed.error)}`);
  return { id, type, event: parsed.data };
}

export type AccountSummary = { id: string; ready: boolean; hint: string };

export type PaymentsProvider = {
  readonly isLocalFake: boolean;
  createAccount(input: { email: string; country: string; setterId: string }): Promise<{ id: string }>;
  createOnboardingLink(input: { accountId: string; returnUrl: string; refreshUrl: string }): Promise<{ url: string }>;
  getAccount(accountId: string): Promise<AccountSummary>;
  createTransfer(input: { accountId: string; amountMinor: number; currency: string; payoutId: string; idempotencyKey: string }): Promise<{ id: string }>;
  createPayout(input: { accountId: string; amountMinor: number; currency: string; payoutId: string; idempotencyKey: string }): Promise<ProviderPayout>;
  retrievePayout(accountId: string, providerPayoutId: string): Promise<ProviderPayout>;
  /** Verifies the signature and parses the event; throws on a bad signature, and ProviderEventUnreadable for an event that does not parse. `event` is null for types we ignore. */
  parseWebhook(rawBody: Buffer | string, signature: string | undefined): { id: string; type: string; event: ProviderEvent | null };
};

/** A signed event is accepted within 5 minutes of its signature's time, either way [the provider's documented default tolerance]. */
export const WEBHOOK_TOLERANCE_SEC = 300;

/**
 * Why the signature's time (`t=` in the Stripe-Signature header) is outside the window, or
 * null. The provider library refuses only signatures that are too old; one dated in the
 * future is refused here too (a replay prepared in advance, or a clock that is wrong).
 */
export function signatureTimeProblem(header: string, nowSec: number, toleranceSec = WEBHOOK_TOLERANCE_SEC): string | null {
  const t = /(?:^|,)\s*t=(\d{1,12})\s*(?:,|$)/.exec(header)?.[1];
  if (t === undefined) return 'the signature carries no time (t=)';
  const age = nowSec - Number(t);
  if (age > toleranceSec) return `the signature is ${age} s old (at most ${toleranceSec} s)`;
  if (age < -toleranceSec) return `the signature is dated ${-age} s in the future (at most ${toleranceSec} s)`;
  return null;
}

/** Whether an account can be paid, and a hint for people (bank and last digits; never the number). */
export function summariseAccount(account: z.infer<typeof accountSchema>): AccountSummary {
  const bank = account.external_accounts?.data[0];
  const ready = Boolean(account.details_submitted && account.payouts_enabled);
  const hint = bank?.last4 ? `${bank.bank_name ?? 'Bank account'} ending ${bank.last4}` : ready ? 'Account ready' : 'Details not finished';
  return { id: account.id, ready, hint };
}

async function call<T>(what: string, run: () => Promise<unknown>, schema: z.ZodType<T>): Promise<T> {
  let answer: unknown;
  try {
    answer = await run();
  } catch (error) {
    if (error instanceof Stripe.errors.StripeError) {
      const status = error.statusCode ?? 0;
      if (status >= 400 && status < 500 && status !== 429 && status !== 409) throw new ProviderRefused(`${what}: ${error.message}`, error.code);
      throw new ProviderUnavailable(`${what}: ${error.message}`);
    }
    throw new ProviderUnavailable(`${what}: ${(error as Error).message}`);
  }
  const parsed = schema.safeParse(answer);
  if (!parsed.success) throw new ProviderUnavailable(`${what}: unexpected answer from the provider (${z.prettifyError(parsed.error)})`);
  return parsed.data;
}

export function createPaymentsProvider(config: PaymentsConfig): PaymentsProvider {
  const stripe = new Stripe(config.secretKey, {
    ...(config.local ? { host: config.local.host, port: config.local.port, protocol: 'http' as const } : {}),
    maxNetworkRetries: 2,
    timeout: 15_000,
    telemetry: false,
    appInfo: { name: 'Squarewright' },
  });
  return {
    isLocalFake: Boolean(config.local),
    createAccount: ({ email, country, setterId }) =>
      call(
        'create account',
        () =>
          stripe.accounts.create({
            type: 'express',
            country,
            email,
            capabilities: { transfers: { requested: true } },
            metadata: { setterId },
          }, { idempotencyKey: `sw-account-${setterId}-${country}` }),
        z.object({ id: z.string() }).loose(),
      ),
    createOnboardingLink: ({ accountId, returnUrl, refreshUrl }) =>
      call(
        'create onboarding link',
        () => stripe.accountLinks.create({ account: accountId, type: 'account_onboarding', return_url: returnUrl, refresh_url: refreshUrl }),
        z.object({ url: z.string() }).loose(),
      ),
    getAccount: async (accountId) => summariseAccount(await call('read account', () => stripe.accounts.retrieve(accountId), accountSchema)),
    createTransfer: ({ accountId, amountMinor, currency, payoutId, idempotencyKey }) =>
      call(
        'transfer to setter',
        () =>
          stripe.transfers.create(
            { amount: amountMinor, currency: currency.toLowerCase(), destination: accountId, transfer_group: `payout_${payoutId}`, metadata: { payoutId } },
            { idempotencyKey },
          ),
        z.object({ id: z.string() }).loose(),
      ),
    createPayout: ({ accountId, amountMinor, currency, payoutId, idempotencyKey }) =>
      call(
        'pay out to bank',
        () => stripe.payouts.create({ amount: amountMinor, currency: currency.toLowerCase(), metadata: { payoutId } }, { idempotencyKey, stripeAccount: accountId }),
        providerPayoutSchema,
      ),
    retrievePayout: (accountId, providerPayoutId) =>
      call('read payout', () => stripe.payouts.retrieve(providerPayoutId, {}, { stripeAccount: accountId }), providerPayoutSchema),
    parseWebhook: (rawBody, signature) => {
      if (!signature) throw new Error('the Stripe-Signature header is missing');
      const late = signatureTimeProblem(signature, Math.floor(Date.now() / 1000));
      if (late) throw new Error(late);
      const verified: unknown = stripe.webhooks.constructEvent(rawBody, signature, config.webhookSecret, WEBHOOK_TOLERANCE_SEC);
      return readProviderEvent(verified);
    },
  };
}
