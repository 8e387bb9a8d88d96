import { mkdtempSync, rmSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FAKE_SECRET_KEY, parseFormBody, startPaymentsFake, type PaymentsFake } from '../../../server/areas/payouts/fake-provider';
import { createPaymentsProvider, ProviderRefused } from '../../../server/areas/payouts/provider';

// The local fake is checked against the provider's own SDK (stripe 23): the SDK's request
// encoding, its error classes, and its webhook signature check (webhooks.constructEvent)
// are the reference. Idempotency follows the provider's API reference ("Idempotent
// requests": same key + same parameters = the first answer again; same key + other
// parameters = an idempotency error).

const secret = 'whsec_fake_test_0123456789abcdef';
let fake: PaymentsFake;
let sdk: Stripe;
const received: { body: string; signature: string }[] = [];
let hook: http.Server;

beforeAll(async () => {
  hook = http.createServer((req, res) => {
    let body = '';
    req.on('data', (c: Buffer) => (body += c.toString('utf8')));
    req.on('end', () => {
      received.push({ body, signature: String(req.headers['stripe-signature'] ?? '') });
      res.end('{}');
    });
  });
  await new Promise<void>((r) => hook.listen(0, '127.0.0.1', () => r()));
  fake = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, webhookUrl: `http://127.0.0.1:${(hook.address() as AddressInfo).port}/hook` });
  sdk = new Stripe(FAKE_SECRET_KEY, { host: fake.host, port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
});
afterAll(async () => {
  await fake.stop();
  await new Promise<void>((r) => hook.close(() => r()));
});

describe('the local fake provider', () => {
  it('reads the form encoding the SDK sends, nested brackets included', () => {
    expect(parseFormBody('type=express&metadata[setterId]=u1&capabilities[transfers][requested]=true&email=a%40b.c')).toEqual({
      type: 'express',
      metadata: { setterId: 'u1' },
      capabilities: { transfers: { requested: 'true' } },
      email: 'a@b.c',
    });
  });

  it('replays an idempotent request and refuses the same key with other parameters', async () => {
    const account = await sdk.accounts.create({ type: 'express', country: 'GB' });
    fake.completeOnboarding(account.id);
    const a = await sdk.transfers.create({ amount: 500, currency: 'gbp', destination: account.id }, { idempotencyKey: 'k-1' });
    const b = await sdk.transfers.create({ amount: 500, currency: 'gbp', destination: account.id }, { idempotencyKey: 'k-1' });
    expect(b.id).toBe(a.id);
    expect(fake.balanceOf(account.id)).toEqual({ gbp: 500 });
    await expect(sdk.transfers.create({ amount: 501, currency: 'gbp', destination: account.id }, { idempotencyKey: 'k-1' })).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });

  it('refuses a wrong API key the way the provider does (401, authentication error)', async () => {
    const wrong = new Stripe('sk_test_wrong', { host: fake.host, port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
    await expect(wrong.accounts.create({ type: 'express' })).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it('refuses a payout larger than the account balance, as a refusal our client does not retry', async () => {
    const provider = createPaymentsProvider({ secretKey: FAKE_SECRET_KEY, webhookSecret: secret, local: { host: fake.host, port: fake.port } });
    const { id } = await provider.createAccount({ email: 'x@y.test', country: 'GB', setterId: 'u-bal' });
    fake.completeOnboarding(id);
    await expect(provider.createPayout({ accountId: id, amountMinor: 100, currency: 'GBP', payoutId: 'p1', idempotencyKey: 'p1-a1' })).rejects.toBeInstanceOf(ProviderRefused);
  });

  it('sends webhooks that the SDK verifies with the shared secret, and that fail with another', async () => {
    const account = await sdk.accounts.create({ type: 'express', country: 'GB' });
    fake.completeOnboarding(account.id);
    await sdk.transfers.create({ amount: 900, currency: 'gbp', destination: account.id });
    const po = await sdk.payouts.create({ amount: 900, currency: 'gbp' }, { stripeAccount: account.id });
    received.length = 0;
    await fake.settleAll();
    const paid = received.find((r) => r.body.includes('"payout.paid"'));
    expect(paid).toBeDefined();
    const event = sdk.webhooks.constructEvent(paid?.body ?? '', paid?.signature ?? '', secret);
    expect(event.type).toBe('payout.paid');
    expect((event.data.object as { id: string }).id).toBe(po.id);
    expect(() => sdk.webhooks.constructEvent(paid?.body ?? '', paid?.signature ?? '', 'whsec_another_secret_000000')).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => sdk.webhooks.constructEvent((paid?.body ?? '').replace('900', '901'), paid?.signature ?? '', secret)).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });
});

describe('the local fake across a restart', () => {
  it('keeps accounts, balances and idempotency keys in its state file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-fake-'));
    const stateFile = join(dir, 'payments-fake.json');
    const first = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, stateFile });
    const one = new Stripe(FAKE_SECRET_KEY, { host: first.host, port: first.port, protocol: 'http', maxNetworkRetries: 0 });
    const account = await one.accounts.create({ type: 'express', country: 'GB' });
    first.completeOnboarding(account.id);
    const transfer = await one.transfers.create({ amount: 300, currency: 'gbp', destination: account.id }, { idempotencyKey: 'restart-1' });
    await first.stop();

    const second = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, stateFile });
    const two = new Stripe(FAKE_SECRET_KEY, { host: second.host, port: second.port, protocol: 'http', maxNetworkRetries: 0 });
    const again = await two.transfers.create({ amount: 300, currency: 'gbp', destination: account.id }, { idempotencyKey: 'restart-1' });
    expect(again.id).toBe(transfer.id);
    expect(second.balanceOf(account.id)).toEqual({ gbp: 300 });
    expect((await two.accounts.retrieve(account.id)).payouts_enabled).toBe(true);
    await second.stop();
    rmSync(dir, { recursive: true, force: true });
  });
});
