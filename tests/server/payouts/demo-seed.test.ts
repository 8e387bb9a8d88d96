import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { payoutsOverviewSchema } from '../../../shared/contracts/payouts';
import { secondDemoSetter, seedDemoPayouts } from '../../../server/areas/payouts/demo-seed';
import { createMoneyTestApp, type MoneyTestApp } from './money-test-app';

let t: MoneyTestApp;
beforeAll(async () => {
  t = await createMoneyTestApp({ demo: { seeders: [{ name: 'payouts', seed: seedDemoPayouts }] }, settleDelayMs: 50 });
});
afterAll(async () => {
  await t.closeAll();
});

describe('the demo money', () => {
  it('shows one setter paid through the fake provider and one still owed', async () => {
    const editor = await t.signInAs('editor');
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    const paid = overview.runs.flatMap((r) => r.payouts);
    expect(paid).toHaveLength(1);
    expect(paid[0]).toMatchObject({ setterName: secondDemoSetter.name, state: 'paid', amountMinor: 11_500 });
    expect(overview.owed.map((o) => o.setterName)).toEqual(['Selma Quist']);
    expect(t.fake.stats().created.payouts).toBe(1);
  });
});
