import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createPayoutRunResponseSchema, earningsSchema, payoutsOverviewSchema } from '../../../shared/contracts/payouts';
import { payout, paymentEvent } from '../../../server/schema';
import { createPayoutRun, resumePendingPayouts, submitPayout } from '../../../server/areas/payouts/payouts';
import type TestAgent from 'supertest/lib/agent';
import Stripe from 'stripe';
import { FAKE_SECRET_KEY, type PaymentsFakeStats } from '../../../server/areas/payouts/fake-provider/index';
import { createMoneyTestApp, testWebhookSecret, type MoneyTestApp } from './money-test-app';

// Payout runs against the local fake provider through the provider's own SDK.
// The behaviour checked is the provider's documented contract (Stripe API reference,
// "Idempotent requests": a repeated Idempotency-Key returns the first result and does not
// perform the operation again; "Webhooks": events are signed with the endpoint secret and
// must be verified over the raw body) - the fake counts what it actually created.

let t: MoneyTestApp;

beforeAll(async () => {
  t = await createMoneyTestApp();
});
afterAll(async () => {
  await t.closeAll();
});

/** A setter signed in (as `${name}@test...`) with finished payout details at the fake, owed these fees. */
async function readySetter(name: string, owed: number[]) {
  const s = await t.newSetter(name);
  const accountId = await t.onboard(s.agent, s.id);
  t.seedFees(s.id, owed);
  return { ...s, accountId };
}

/** The editor's "Run a payout" for one setter (a new request key unless given). */
function runFor(editor: TestAgent, setterId: string, requestKey: string = randomUUID()) {
  return editor.post('/api/payouts/runs').send({ requestKey, setterIds: [setterId] });
}

/** What the fake created since a reading of its stats. */
function createdSince(before: PaymentsFakeStats) {
  const now = t.fake.stats();
  return { transfers: now.created.transfers - before.created.transfers, payouts: now.created.payouts - before.created.payouts };
}

/** The first payout of a run, from the answer to "Run a payout". */
function firstPayoutOf(body: unknown) {
  const [first] = createPayoutRunResponseSchema.parse(body).run.payouts;
  if (!first) throw new Error('the run has no payout');
  return first;
}

/** The provider's id of one of our payouts (set once it was sent). */
function providerPayoutIdOf(payoutId: string): string | null {
  return t.db.select({ providerPayoutId: payout.providerPayoutId }).from(payout).where(eq(payout.id, payoutId)).get()?.providerPayoutId ?? null;
}

/** Posts an event to our webhook signed with the endpoint secret, by the SDK's test signer. */
function postSignedWebhook(payload: string) {
  const signature = new Stripe(FAKE_SECRET_KEY).webhooks.generateTestHeaderString({ payload, secret: testWebhookSecret });
  return request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', signature).send(payload);
}

function payoutsOf(setterId: string) {
  return t.db.select({ id: payout.id, state: payout.state, attempt: payout.attempt, amountMinor: payout.amountMinor }).from(payout).where(eq(payout.setterId, setterId)).all();
}

describe('payout runs', () => {
  it('the same run request twice pays once, and the provider creates one transfer and one payout', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Ada', [1500, 2500]);
    const before = t.fake.stats();
    const requestKey = randomUUID();

    const first = await editor.post('/api/payouts/runs').send({ requestKey }).expect(201);
    const second = await editor.post('/api/payouts/runs').send({ requestKey }).expect(201);
    const a = createPayoutRunResponseSchema.parse(first.body);
    const b = createPayoutRunResponseSchema.parse(second.body);
    expect(b.replayed).toBe(true);
    expect(b.run.id).toBe(a.run.id);
    const mine = a.run.payouts.filter((p) => p.setterId === s.id);
    expect(mine).toHaveLength(1);
    expect(mine[0]?.amountMinor).toBe(4000);
    expect(mine[0]?.state).toBe('pending');

    // A new click (new key) finds nothing owed any more: 409, nothing sent.
    const third = await runFor(editor, s.id);
    expect(third.status).toBe(409);

    expect(createdSince(before)).toEqual({ transfers: 1, payouts: 1 });

    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
    expect(t.fake.paidOutTo(s.accountId)).toEqual({ gbp: 4000 });
    const earnings = earningsSchema.parse((await s.agent.get('/api/earnings').expect(200)).body);
    expect(earnings.payouts[0]?.state).toBe('paid');
    expect(earnings.owed).toEqual([]);
  });

  it('two clicks at once with the same key: one run, one transfer, one payout', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Hana', [2200]);
    const before = t.fake.stats();
    const requestKey = randomUUID();
    const [a, b] = await Promise.all([runFor(editor, s.id, requestKey), runFor(editor, s.id, requestKey)]);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(a.body.run.id).toBe(b.body.run.id);
    expect([a.body.replayed, b.body.replayed].sort()).toEqual([false, true]);
    expect(createdSince(before)).toEqual({ transfers: 1, payouts: 1 });
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(s.accountId)).toEqual({ gbp: 2200 });
  });

  it('skips a setter without payout details and says why', async () => {
    const editor = await t.signInAs('editor');
    const s = await t.newSetter('Noor');
    t.seedFees(s.id, [900]);
    const res = await runFor(editor, s.id);
    expect(res.status).toBe(409);
    expect(JSON.stringify(res.body.error.details)).toContain('no payout details yet');
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    expect(overview.owed.find((o) => o.setterId === s.id)).toMatchObject({ owedMinor: 900, detailsStatus: null });
  });

  it('a transient provider fault is retried by the SDK with the same key: still one payout', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Bram', [700]);
    const before = t.fake.stats();
    t.fake.failNextRequest('POST', '/v1/payouts');
    await runFor(editor, s.id).expect(201);
    expect(createdSince(before).payouts).toBe(1);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(s.accountId)).toEqual({ gbp: 700 });
  });

  it.each(['transfer', 'payout'] as const)('a restart between the %s call and storing its answer does not pay twice', async (crashStep) => {
    const s = await readySetter(`Cleo${crashStep}`, [1200]);
    const deps = t.payoutsDeps({
      afterProviderCall: (step) => {
        if (step === crashStep) throw new Error(`simulated crash after the provider made the ${step}`);
      },
    });
    const before = t.fake.stats();
    await expect(createPayoutRun(deps, await t.createUser('editor'), { requestKey: randomUUID(), setterIds: [s.id] })).rejects.toThrow('simulated crash');
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['pending']);
    const mid = t.fake.stats();
    // "Restart": a fresh service resumes what was left pending, with the same keys.
    const { resumed } = await resumePendingPayouts(t.payoutsDeps());
    expect(resumed).toBeGreaterThanOrEqual(1);
    expect(t.fake.stats().replays).toBeGreaterThan(mid.replays);
    expect(createdSince(before)).toEqual({ transfers: 1, payouts: 1 });
    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
    expect(t.fake.paidOutTo(s.accountId)).toEqual({ gbp: 1200 });
  });

  it('a payout the bank refuses ends failed, and a retry pays it once', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Dara', [3000]);
    t.fake.failPayoutsFor(s.accountId, 'Bank account closed (test).');
    await runFor(editor, s.id).expect(201);
    await t.fake.settleAll();
    const [failed] = payoutsOf(s.id);
    expect(failed?.state).toBe('failed');
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    const shown = overview.runs.flatMap((r) => r.payouts).find((p) => p.id === failed?.id);
    expect(shown?.failureMessage).toContain('Bank account closed');
    // A failed payout still holds its money: no new run can pay the same fees again.
    expect(overview.owed.find((o) => o.setterId === s.id)).toBeUndefined();

    t.fake.clearFailures(s.accountId);
    const retried = await editor.post(`/api/payouts/${failed?.id}/retry`).expect(200);
    expect(retried.body.payout).toMatchObject({ state: 'pending', attempt: 2 });
    await editor.post(`/api/payouts/${failed?.id}/retry`).expect(409);
    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
    expect(t.fake.paidOutTo(s.accountId)).toEqual({ gbp: 3000 });
    // The transfer to the setter's account was made once; only the bank payout was redone.
    expect(t.fake.balanceOf(s.accountId)).toEqual({ gbp: 0 });
  });

  it('a transfer the provider refuses leaves the payout failed at once, and retryable', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Emil', [450]);
    t.fake.failTransfersFor(s.accountId);
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const res = await runFor(editor, s.id).expect(201);
    warn.mockRestore();
    const refused = firstPayoutOf(res.body);
    expect(refused).toMatchObject({ state: 'failed' });
    t.fake.clearFailures(s.accountId);
    await editor.post(`/api/payouts/${refused.id}/retry`).expect(200);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(s.accountId)).toEqual({ gbp: 450 });
  });

  it('submitting a payout that is already paid calls the provider no more', async () => {
    const s = await readySetter('Fenna', [100]);
    const editor = await t.signInAs('editor');
    const res = await runFor(editor, s.id).expect(201);
    await t.fake.settleAll();
    const before = t.fake.stats().requests;
    await submitPayout(t.payoutsDeps(), firstPayoutOf(res.body).id);
    expect(t.fake.stats().requests).toBe(before);
  });
});

describe('the provider webhook', () => {
  it('refuses a bad signature with 400, logs it, and changes nothing', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Gus', [800]);
    const providerPayoutId = providerPayoutIdOf(firstPayoutOf((await runFor(editor, s.id).expect(201)).body).id);
    const body = JSON.stringify({ id: 'evt_forged', object: 'event', type: 'payout.paid', data: { object: { id: providerPayoutId, object: 'payout', status: 'paid', amount: 800, currency: 'gbp' } } });
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const forged = await request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', 't=1,v1=deadbeef').send(body);
    const unsigned = await request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').send(body);
    expect(warn.mock.calls.some((c) => String(c[0]).includes('bad signature'))).toBe(true);
    warn.mockRestore();
    expect(forged.status).toBe(400);
    expect(unsigned.status).toBe(400);
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['pending']);
    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
  });

  it('refuses a signed event we act on that is not in the form the provider sends (400, logged), and applies nothing', async () => {
    const editor = await t.signInAs('editor');
    const s = await readySetter('Hugo', [600]);
    const providerPayoutId = providerPayoutIdOf(firstPayoutOf((await runFor(editor, s.id).expect(201)).body).id);
    // A payout without amount and currency is not a payout object (Stripe API reference, "The Payout object").
    const unreadable = JSON.stringify({ id: 'evt_unreadable', object: 'event', type: 'payout.paid', data: { object: { id: providerPayoutId, object: 'payout', status: 'paid' } } });
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const refused = await postSignedWebhook(unreadable);
    expect(warn.mock.calls.some((c) => String(c[0]).includes('evt_unreadable') && String(c[0]).includes('amount'))).toBe(true);
    warn.mockRestore();
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toContain('nothing was applied');
    expect(t.db.select({ id: paymentEvent.id }).from(paymentEvent).where(eq(paymentEvent.id, 'evt_unreadable')).all()).toEqual([]);
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['pending']);
    // A signed event of a type we do not act on is acknowledged and left alone.
    const other = await postSignedWebhook(JSON.stringify({ id: 'evt_other', object: 'event', type: 'balance.available', data: { object: {} } }));
    expect(other.status).toBe(200);
    expect(other.body).toEqual({ received: true, result: 'ignored' });
    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
  });
});

describe('role checks', () => {
  const routes: [method: 'get' | 'post', path: string, body?: object][] = [
    ['get', '/api/payouts'],
    ['post', '/api/payouts/runs', { requestKey: randomUUID() }],
    ['post', '/api/payouts/nope/retry'],
    ['post', '/api/ledger/corrections', {}],
    ['get', '/api/earnings'],
    ['get', '/api/earnings/statements/2026-11'],
    ['get', '/api/earnings/statements/2026-11.csv'],
    ['post', '/api/earnings/statements/2026-11/send'],
    ['post', '/api/earnings/payout-details', { country: 'GB' }],
  ];
  const editorOnly = new Set(['/api/payouts', '/api/payouts/runs', '/api/payouts/nope/retry', '/api/ledger/corrections']);

  it('printers get 403 on every money route, strangers 401, each role only its own side', async () => {
    const agents = { printer: await t.signInAs('printer'), setter: await t.signInAs('setter'), editor: await t.signInAs('editor'), admin: await t.signInAs('admin') };
    for (const [method, path, body] of routes) {
      const anon = await request(t.app)[method](path).send(body ?? {});
      expect(anon.status, `anonymous ${method} ${path}`).toBe(401);
      const printer = await agents.printer[method](path).send(body ?? {});
      expect(printer.status, `printer ${method} ${path}`).toBe(403);
      const wrong = editorOnly.has(path) ? agents.setter : agents.editor;
      const res = await wrong[method](path).send(body ?? {});
      expect(res.status, `wrong role ${method} ${path}`).toBe(403);
      const right = editorOnly.has(path) ? agents.admin : agents.setter;
      const ok = await right[method](path).send(body ?? {});
      expect([401, 403], `allowed role ${method} ${path} answered ${ok.status}`).not.toContain(ok.status);
    }
  });
});
