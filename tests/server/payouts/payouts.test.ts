import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createPayoutRunResponseSchema, earningsSchema, payoutsOverviewSchema } from '../../../shared/contracts/payouts';
import { payout } from '../../../server/schema';
import { createPayoutRun, resumePendingPayouts, submitPayout } from '../../../server/areas/payouts/payouts';
import { createMoneyTestApp, type MoneyTestApp } from './money-test-app';

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

async function newSetter(name: string) {
  const email = `${name.toLowerCase()}@test.squarewright.test`;
  const agent = await t.signInAs('setter', { email, name });
  const id = await t.createUser('setter', { email });
  return { agent, id, email };
}

function payoutsOf(setterId: string) {
  return t.db.select({ id: payout.id, state: payout.state, attempt: payout.attempt, amountMinor: payout.amountMinor }).from(payout).where(eq(payout.setterId, setterId)).all();
}

describe('payout runs', () => {
  it('the same run request twice pays once, and the provider creates one transfer and one payout', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Ada');
    const accountId = await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [1500, 2500]);
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
    const third = await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] });
    expect(third.status).toBe(409);

    const after = t.fake.stats();
    expect(after.created.transfers - before.created.transfers).toBe(1);
    expect(after.created.payouts - before.created.payouts).toBe(1);

    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 4000 });
    const earnings = earningsSchema.parse((await s.agent.get('/api/earnings').expect(200)).body);
    expect(earnings.payouts[0]?.state).toBe('paid');
    expect(earnings.owed).toEqual([]);
  });

  it('two clicks at once with the same key: one run, one transfer, one payout', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Hana');
    const accountId = await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [2200]);
    const before = t.fake.stats();
    const requestKey = randomUUID();
    const [a, b] = await Promise.all([
      editor.post('/api/payouts/runs').send({ requestKey, setterIds: [s.id] }),
      editor.post('/api/payouts/runs').send({ requestKey, setterIds: [s.id] }),
    ]);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(a.body.run.id).toBe(b.body.run.id);
    expect([a.body.replayed, b.body.replayed].sort()).toEqual([false, true]);
    const after = t.fake.stats();
    expect(after.created.transfers - before.created.transfers).toBe(1);
    expect(after.created.payouts - before.created.payouts).toBe(1);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 2200 });
  });

  it('skips a setter without payout details and says why', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Noor');
    t.seedFees(s.id, [900]);
    const res = await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] });
    expect(res.status).toBe(409);
    expect(JSON.stringify(res.body.error.details)).toContain('no payout details yet');
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    expect(overview.owed.find((o) => o.setterId === s.id)).toMatchObject({ owedMinor: 900, detailsStatus: null });
  });

  it('a transient provider fault is retried by the SDK with the same key: still one payout', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Bram');
    const accountId = await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [700]);
    const before = t.fake.stats();
    t.fake.failNextRequest('POST', '/v1/payouts');
    await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] }).expect(201);
    const after = t.fake.stats();
    expect(after.created.payouts - before.created.payouts).toBe(1);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 700 });
  });

  it.each(['transfer', 'payout'] as const)('a restart between the %s call and storing its answer does not pay twice', async (crashStep) => {
    const s = await newSetter(`Cleo${crashStep}`);
    const accountId = await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [1200]);
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
    const after = t.fake.stats();
    expect(after.replays).toBeGreaterThan(mid.replays);
    expect(after.created.transfers - before.created.transfers).toBe(1);
    expect(after.created.payouts - before.created.payouts).toBe(1);
    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 1200 });
  });

  it('a payout the bank refuses ends failed, and a retry pays it once', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Dara');
    const accountId = await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [3000]);
    t.fake.failPayoutsFor(accountId, 'Bank account closed (test).');
    await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] }).expect(201);
    await t.fake.settleAll();
    const [failed] = payoutsOf(s.id);
    expect(failed?.state).toBe('failed');
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    const shown = overview.runs.flatMap((r) => r.payouts).find((p) => p.id === failed?.id);
    expect(shown?.failureMessage).toContain('Bank account closed');
    // A failed payout still holds its money: no new run can pay the same fees again.
    expect(overview.owed.find((o) => o.setterId === s.id)).toBeUndefined();

    t.fake.clearFailures(accountId);
    const retried = await editor.post(`/api/payouts/${failed?.id}/retry`).expect(200);
    expect(retried.body.payout).toMatchObject({ state: 'pending', attempt: 2 });
    await editor.post(`/api/payouts/${failed?.id}/retry`).expect(409);
    await t.fake.settleAll();
    expect(payoutsOf(s.id).map((p) => p.state)).toEqual(['paid']);
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 3000 });
    // The transfer to the setter's account was made once; only the bank payout was redone.
    expect(t.fake.balanceOf(accountId)).toEqual({ gbp: 0 });
  });

  it('a transfer the provider refuses leaves the payout failed at once, and retryable', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Emil');
    const accountId = await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [450]);
    t.fake.failTransfersFor(accountId);
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const res = await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] }).expect(201);
    warn.mockRestore();
    expect(res.body.run.payouts[0]).toMatchObject({ state: 'failed' });
    t.fake.clearFailures(accountId);
    await editor.post(`/api/payouts/${res.body.run.payouts[0].id}/retry`).expect(200);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 450 });
  });

  it('submitting a payout that is already paid calls the provider no more', async () => {
    const s = await newSetter('Fenna');
    await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [100]);
    const editor = await t.signInAs('editor');
    const res = await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] }).expect(201);
    await t.fake.settleAll();
    const before = t.fake.stats().requests;
    await submitPayout(t.payoutsDeps(), res.body.run.payouts[0].id);
    expect(t.fake.stats().requests).toBe(before);
  });
});

describe('the provider webhook', () => {
  it('refuses a bad signature with 400, logs it, and changes nothing', async () => {
    const editor = await t.signInAs('editor');
    const s = await newSetter('Gus');
    await t.onboard(s.agent, s.id);
    t.seedFees(s.id, [800]);
    const res = await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] }).expect(201);
    const payoutRow = t.db.select({ providerPayoutId: payout.providerPayoutId }).from(payout).where(eq(payout.id, res.body.run.payouts[0].id)).get();
    const body = JSON.stringify({ id: 'evt_forged', object: 'event', type: 'payout.paid', data: { object: { id: payoutRow?.providerPayoutId, object: 'payout', status: 'paid', amount: 800, currency: 'gbp' } } });
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
