import { randomUUID } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText } from '../../../shared/contracts/editions';
import { eventEnvelopeSchema, type EventEnvelope } from '../../../shared/contracts/integrations';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';
import { createMoneyTestApp, type MoneyTestApp } from '../payouts/money-test-app';

// Every event of issue 18 comes from the area that owns the change, through the real routes:
// a submission reviewed, a foundry run finished, an edition through proof (returned, sent
// again, approved) and published, and the setter's payout paid by the (fake) provider.

let t: MoneyTestApp;
let puzzles: StubPuzzles;
let hook: Server;
const got: EventEnvelope[] = [];

beforeAll(async () => {
  t = await createMoneyTestApp();
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  hook = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      got.push(eventEnvelopeSchema.parse(JSON.parse(Buffer.concat(chunks).toString('utf8'))));
      res.writeHead(204).end();
    });
  });
  await new Promise<void>((r) => hook.listen(0, '127.0.0.1', () => r()));
  const admin = await t.signInAs('admin');
  const url = `http://127.0.0.1:${(hook.address() as AddressInfo).port}/events`;
  await admin
    .post('/api/webhooks/endpoints')
    .send({ url, events: ['edition.published', 'edition.proof_sent', 'edition.proof_returned', 'edition.approved', 'submission.reviewed', 'foundry.run_finished', 'payout.paid'] })
    .expect(201);
});
afterAll(async () => {
  hook.closeAllConnections();
  await new Promise<void>((r) => hook.close(() => r()));
  await t.closeAll();
});

async function delivered(type: string) {
  for (let i = 0; i < 100; i++) {
    await t.deps.webhooks.flush();
    const found = got.filter((e) => e.type === type);
    if (found.length > 0) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no ${type} event delivered; got ${got.map((e) => e.type).join(', ')}`);
}

describe('events from the owning areas', () => {
  it('submission.reviewed when an editor accepts a submission', async () => {
    const { agent: setter } = await t.newSetter('Event Setter', 'events@test.squarewright.test');
    const s = await setter.post('/api/submissions').send({ code: '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)', source: 'paste' }).expect(201);
    const editor = await t.signInAs('editor');
    const accepted = await editor.post(`/api/submissions/${s.body.id}/accept`).send({}).expect(200);
    const [e] = await delivered('submission.reviewed');
    expect(e!.data).toEqual({ submission: { id: String(s.body.id), status: 'accepted', stockId: String(accepted.body.stockId), order: 9 } });
  });

  it('foundry.run_finished when a run ends, with what it found', async () => {
    const editor = await t.signInAs('editor');
    const run = await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 9, squaresOnly: false }).expect(201);
    await t.deps.jobs.wait(run.body.id);
    const [e] = await delivered('foundry.run_finished');
    const after = (await editor.get(`/api/foundry/runs/${run.body.id}`).expect(200)).body;
    // OEIS A002839: 2 simple perfect squared rectangles of order 9
    expect(after.foundPerfect).toBe(2);
    expect(e!.data).toEqual({ run: { id: run.body.id, mode: 'exhaustive', state: 'done', found: after.found, addedToStock: after.addedToStock } });
  });

  it('the proof round and publishing: proof_sent, proof_returned, approved, published; then payout.paid', async () => {
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
    const printers = (await admin.get('/api/admin/users').expect(200)).body.users.filter((u: { role: string }) => u.role === 'printer').map((u: { id: string }) => u.id);
    await admin.put(`/api/publications/${pub.body.id}/printers`).send({ userIds: printers });
    const ed = await editor.post('/api/editions').send({ publicationId: pub.body.id, number: 7, date: '2026-11-28', introduction: plainRichText('Two for the weekend.') }).expect(201);
    const id = ed.body.id as string;
    // the sample tilings' smallest squares print under the column template's floor: sent with a reason (issue 16)
    const override = { reason: 'Event test: the floor is not what this test is about.' };
    const patched = await editor.patch(`/api/editions/${id}`).send({ slots: [{ puzzleId: pzA }, { puzzleId: pzD }] }).expect(200);
    await editor.post(`/api/editions/${id}/proofs`).send({ updatedAt: patched.body.updatedAt, override }).expect(201);
    const sent = await delivered('edition.proof_sent');
    expect(sent[0]!.data).toMatchObject({ edition: { id, publicationTitle: 'The Saturday Quadrant', number: 7, editionDate: '2026-11-28', state: 'in_proof' }, proofVersion: 1 });
    await printer.post(`/api/editions/${id}/proofs/1/return`).send({ notes: 'Square 4 prints too light.' }).expect(200);
    const returned = await delivered('edition.proof_returned');
    expect(returned[0]!.data).toMatchObject({ edition: { id, state: 'draft' }, proofVersion: 1, notes: 'Square 4 prints too light.' });
    const again = (await editor.get(`/api/editions/${id}`).expect(200)).body;
    await editor.post(`/api/editions/${id}/proofs`).send({ updatedAt: again.updatedAt, override }).expect(201);
    await printer.post(`/api/editions/${id}/proofs/2/approve`).send({}).expect(200);
    const approved = await delivered('edition.approved');
    expect(approved[0]!.data).toMatchObject({ edition: { id, state: 'approved' }, proofVersion: 2 });
    await editor.post(`/api/editions/${id}/publish`).send({}).expect(200);
    const published = await delivered('edition.published');
    expect(published[0]!.data).toMatchObject({ edition: { id, state: 'published', number: 7 } });
    expect(got.filter((e) => e.type === 'edition.proof_sent').map((e) => (e.data as { proofVersion: number }).proofVersion)).toEqual([1, 2]);

    const accountId = await t.onboard(setter, setterId);
    await editor.post('/api/payouts/runs').send({ requestKey: randomUUID() }).expect(201);
    await t.fake.settleAll();
    expect(t.fake.paidOutTo(accountId)).toEqual({ gbp: 10_500 });
    const paid = await delivered('payout.paid');
    expect(paid).toHaveLength(1);
    expect(paid[0]!.data).toMatchObject({ payout: { amountMinor: 10_500, currency: 'GBP' } });
    // each event once, each with its own id
    expect(new Set(got.map((e) => e.id)).size).toBe(got.length);
  }, 120_000);
});
