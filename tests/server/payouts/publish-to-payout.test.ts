import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText } from '../../../shared/contracts/editions';
import { earningsSchema, payoutsOverviewSchema } from '../../../shared/contracts/payouts';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';
import { createMoneyTestApp, type MoneyTestApp } from './money-test-app';
import { assignPrinters } from '../editions/fixtures';

// From print to payment through the real publish step: an edition of the Saturday
// Quadrant goes through proof and approval, is published (fees written in the publish
// transaction at the publication's rates), and the editor pays the setter through the
// local fake provider. The puzzles are stubs standing in for the puzzle area (as in the
// print area's own tests); the tilings are the print area's published fixtures.

let t: MoneyTestApp;
let puzzles: StubPuzzles;

beforeAll(async () => {
  t = await createMoneyTestApp();
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
});
afterAll(async () => {
  await t.closeAll();
});

describe('publish, then pay', () => {
  it('publishing an edition accrues one fee per puzzle, and the editor pays exactly that', async () => {
    const { agent: setter, id: setterId } = await t.newSetter('Printed Setter', 'printed@test.squarewright.test');
    const pzA = puzzles.add({ tiling: TILING_69x61, kind: 'assembly', setterId }).id;
    const pzD = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId }).id;
    const admin = await t.signInAs('admin');
    const editor = await t.signInAs('editor');
    const printer = await t.signInAs('printer');

    const pub = await admin
      .post('/api/publications')
      .send({ title: 'The Saturday Quadrant', publisher: 'Larkspur & Quill Press', templateId: 'newspaper-column', cadence: 'weekly', solutionRule: 'same_edition', reuseWindowDays: 90, currency: 'GBP', feeAssemblyMinor: 4500, feeDeductionMinor: 6000 })
      .expect(201);
    assignPrinters(t, pub.body.id); // printers see only their publications' proofs (issue 17)
    const ed = await editor.post('/api/editions').send({ publicationId: pub.body.id, number: 7, date: '2026-11-28', introduction: plainRichText('Two for the weekend.') }).expect(201);
    await editor.patch(`/api/editions/${ed.body.id}`).send({ slots: [{ puzzleId: pzA }, { puzzleId: pzD }] }).expect(200);
    // the Assembly's half-scale pieces are under the column's 3 mm floor: sent past it with a reason (issue 16)
    await editor.post(`/api/editions/${ed.body.id}/proofs`).send({ override: { reason: 'Small pieces agreed with the printer.' } }).expect(201);
    await printer.post(`/api/editions/${ed.body.id}/proofs/1/approve`).expect(200);
    await editor.post(`/api/editions/${ed.body.id}/publish`).expect(200);

    const earned = earningsSchema.parse((await setter.get('/api/earnings').expect(200)).body);
    expect(earned.entries.map((e) => [e.puzzleId, e.amountMinor, e.date, e.editionId]).sort()).toEqual([
      [pzA, 4500, '2026-11-28', ed.body.id],
      [pzD, 6000, '2026-11-28', ed.body.id],
    ].sort());
    expect(earned.owed).toEqual([{ currency: 'GBP', amountMinor: 10_500 }]);

    const accountId = await t.onboard(setter, setterId);
    await editor.post('/api/payouts/runs').send({ requestKey: randomUUID() }).expect(201);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 10_500 });
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    expect(overview.owed).toEqual([]);
    const after = earningsSchema.parse((await setter.get('/api/earnings').expect(200)).body);
    expect(after.payouts.map((p) => [p.state, p.amountMinor])).toEqual([['paid', 10_500]]);

    // issue 16: she is told she was paid, with her statement of the month
    const paidMail = await t.mailbox.waitFor({ to: 'printed@test.squarewright.test', subject: 'You have been paid £105.00' });
    expect(paidMail.text).toContain('Paid out to you this month: £105.00');
    expect(paidMail.text).toMatch(/taxable income/);
    // and her statement's CSV names the edition and the publication, not their internal ids
    const csv = (await setter.get('/api/earnings/statements/2026-11.csv').expect(200)).text;
    expect(csv).toContain('Fee for assembly puzzle');
    expect(csv).toContain('in The Saturday Quadrant No. 7');
    expect(csv).toContain(',No. 7,The Saturday Quadrant,');
    expect(csv).not.toContain(ed.body.id);
    expect(csv).not.toContain(pub.body.id);
  });
});
