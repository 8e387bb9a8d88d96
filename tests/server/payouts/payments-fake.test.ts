import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Stripe from 'stripe';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { FAKE_SECRET_KEY, FakeStateFileError, parseFormBody, startPaymentsFake, type PaymentsFake } from '../../../server/areas/payouts/fake-provider/index';
import { closeServer, listenOnLoopback } from '../../../server/areas/payouts/fake-provider/http-server';
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

/** The provider's SDK pointed at a fake, without retries (so every refusal shows). */
function sdkFor(target: PaymentsFake, key = FAKE_SECRET_KEY): Stripe {
  return new Stripe(key, { host: target.host, port: target.port, protocol: 'http', maxNetworkRetries: 0 });
}

beforeAll(async () => {
  hook = http.createServer((req, res) => {
    let body = '';
    req.on('data', (c: Buffer) => (body += c.toString('utf8')));
    req.on('end', () => {
      received.push({ body, signature: String(req.headers['stripe-signature'] ?? '') });
      res.end('{}');
    });
  });
  const { url } = await listenOnLoopback(hook);
  fake = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, webhookUrl: `${url}/hook` });
  sdk = sdkFor(fake);
});
afterAll(async () => {
  await fake.stop();
  await closeServer(hook);
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
    await expect(sdkFor(fake, 'sk_test_wrong').accounts.create({ type: 'express' })).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it('refuses a missing or wrong parameter naming it, as the provider does (400, invalid request)', async () => {
    const account = await sdk.accounts.create({ type: 'express', country: 'GB' });
    fake.completeOnboarding(account.id);
    // Without a destination, which the SDK's types would not let through.
    const missing = await sdk.transfers.create({ amount: 500, currency: 'gbp' } as Stripe.TransferCreateParams).catch((e: unknown) => e);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ code: 'parameter_missing', param: 'destination', message: 'Missing required param: destination.' });
    const fraction = await sdk.transfers.create({ amount: 5.5, currency: 'gbp', destination: account.id }).catch((e: unknown) => e);
    expect(fraction).toMatchObject({ code: 'parameter_invalid_integer', param: 'amount' });
    expect(fake.balanceOf(account.id)).toEqual({});
  });

  it('takes its switches over HTTP too (/__fake/*, for a browser session against the dev server)', async () => {
    const account = await sdk.accounts.create({ type: 'express', country: 'GB' });
    const flip = (action: string) => fetch(`${fake.url}/__fake/accounts/${account.id}/${action}`, { method: 'POST' });
    expect((await flip('complete-onboarding')).status).toBe(200);
    expect((await flip('fail-transfers')).status).toBe(200);
    await expect(sdk.transfers.create({ amount: 100, currency: 'gbp', destination: account.id })).rejects.toMatchObject({ code: 'account_invalid' });
    expect((await flip('clear-failures')).status).toBe(200);
    await sdk.transfers.create({ amount: 100, currency: 'gbp', destination: account.id });
    const stats = z.object({ created: z.object({ transfers: z.number() }) }).parse(await (await fetch(`${fake.url}/__fake/stats`)).json());
    expect(stats.created.transfers).toBe(fake.stats().created.transfers);
    expect(fake.balanceOf(account.id)).toEqual({ gbp: 100 });
    expect((await fetch(`${fake.url}/__fake/accounts/${account.id}/explode`, { method: 'POST' })).status).toBe(404);
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
    expect(z.object({ id: z.string() }).parse(event.data.object).id).toBe(po.id);
    expect(() => sdk.webhooks.constructEvent(paid?.body ?? '', paid?.signature ?? '', 'whsec_another_secret_000000')).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => sdk.webhooks.constructEvent((paid?.body ?? '').replace('900', '901'), paid?.signature ?? '', secret)).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });
});

describe('the local fake across a restart', () => {
  let dir: string;
  let stateFile: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'sw-fake-'));
  });
  afterEach(() => {
    rmSync(stateFile, { force: true });
  });
  afterAll(() => {
    rmSync(dir, { recursive: true, force: true });
  });
  const fileNamed = (name: string) => (stateFile = join(dir, name));

  it('keeps accounts, balances and idempotency keys in its state file', async () => {
    fileNamed('payments-fake.json');
    const first = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, stateFile });
    const account = await sdkFor(first).accounts.create({ type: 'express', country: 'GB' });
    first.completeOnboarding(account.id);
    const transfer = await sdkFor(first).transfers.create({ amount: 300, currency: 'gbp', destination: account.id }, { idempotencyKey: 'restart-1' });
    await first.stop();

    const second = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, stateFile });
    const two = sdkFor(second);
    const again = await two.transfers.create({ amount: 300, currency: 'gbp', destination: account.id }, { idempotencyKey: 'restart-1' });
    expect(again.id).toBe(transfer.id);
    expect(second.balanceOf(account.id)).toEqual({ gbp: 300 });
    expect((await two.accounts.retrieve(account.id)).payouts_enabled).toBe(true);
    await second.stop();
  });

  it('reads a state file the fake wrote before it was split into modules (fixtures/README.md)', async () => {
    // The fixture's objects: account A paid 115.00 (payout p1), B with 40.00 pending (p2), C unfinished.
    const [a, b, c] = ['acct_WtAlo5evu7KyH8MM', 'acct_zqIAe6o13DPZZ087', 'acct_reX9LzDWyoL51T5e'];
    copyFileSync(join(import.meta.dirname, 'fixtures', 'payments-fake-state-2da9d42.json'), fileNamed('payments-fake.json'));
    const lines: string[] = [];
    const restarted = await startPaymentsFake({ webhookSecret: secret, autoSettle: false, stateFile, log: (line) => lines.push(line) });
    expect(lines).toContain(`state loaded from ${stateFile}: 3 accounts, 2 payouts`);
    const provider = createPaymentsProvider({ secretKey: FAKE_SECRET_KEY, webhookSecret: secret, local: { host: restarted.host, port: restarted.port } });
    expect(await provider.getAccount(a)).toEqual({ id: a, ready: true, hint: 'Fake Test Bank ending 6789' });
    expect(await provider.getAccount(c)).toEqual({ id: c, ready: false, hint: 'Details not finished' });
    expect(restarted.paidOutTo(a)).toEqual({ gbp: 11_500 });
    // Payout p1's transfer again, with its key: the stored answer, nothing moved.
    const replay = await provider.createTransfer({ accountId: a, amountMinor: 11_500, currency: 'GBP', payoutId: 'p1', idempotencyKey: 'sw-payout-p1-a1-transfer' });
    expect(replay.id).toBe('tr_CFwMDA0EVPJbFh1B');
    expect(restarted.stats()).toMatchObject({ replays: 1, created: { transfers: 0 } });
    expect(restarted.balanceOf(a)).toEqual({ gbp: 0 });
    // The refused transfer to C is replayed as the refusal it was.
    await expect(sdkFor(restarted).transfers.create({ amount: 100, currency: 'gbp', destination: c }, { idempotencyKey: 'sw-payout-p3-a1-transfer' })).rejects.toMatchObject({ code: 'account_invalid' });
    expect(restarted.stats().replays).toBe(2);
    // B's pending payout settles after the restart.
    await restarted.settleAll();
    expect(restarted.paidOutTo(b)).toEqual({ gbp: 4_000 });
    await restarted.stop();
  });

  it('refuses to start on a state file that is not JSON, naming the file and leaving it as it was', async () => {
    writeFileSync(fileNamed('payments-fake.json'), '{"accounts": [');
    const failed = await startPaymentsFake({ webhookSecret: secret, stateFile }).catch((e: unknown) => e);
    expect(failed).toBeInstanceOf(FakeStateFileError);
    expect(failed).toMatchObject({ file: stateFile });
    expect(String(failed)).toContain(stateFile);
    expect(String(failed)).toContain('not valid JSON');
    expect(readFileSync(stateFile, 'utf8')).toBe('{"accounts": [');
  });

  it('refuses to start on a state file of another shape, naming the file and the field', async () => {
    const fixture = JSON.parse(readFileSync(join(import.meta.dirname, 'fixtures', 'payments-fake-state-2da9d42.json'), 'utf8'));
    fixture.payouts[1].payout.status = 'lost';
    const text = JSON.stringify(fixture);
    writeFileSync(fileNamed('payments-fake.json'), text);
    const failed = await startPaymentsFake({ webhookSecret: secret, stateFile }).catch((e: unknown) => e);
    expect(failed).toBeInstanceOf(FakeStateFileError);
    expect(String(failed)).toContain(stateFile);
    expect(String(failed)).toContain('payouts[1].payout.status');
    expect(readFileSync(stateFile, 'utf8')).toBe(text);
  });
});
