import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText, type PreflightReport } from '../../../shared/contracts/editions';
import { parseTiling } from '../../../shared/tiling/index';
import { preflightChecks } from '../../../server/areas/editions/edition-checks';
import { preflightWords } from '../../../server/areas/editions/proofs';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { assignPrinters, quadrantPublication } from './fixtures';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';

// Issue 16: the workflow's guards, enforced by the server. A proof goes out only from the
// saved state the editor saw, with at least one puzzle and every check passed (the
// preflight's floor errors only with a recorded reason); publishing is refused before the
// edition's date and ahead of an earlier unpublished edition unless an admin gives a
// reason, recorded with the edition.

// Published tiling: order 12, 112 x 99, from the catalogue of simple perfect squared
// rectangles (tests/fixtures/puzzle/o12spsr.bkp, see its SOURCE). As an Assembly, its
// 2-piece in the half-scale piece row of the 76 mm newspaper column is 2 * 76 / 112 / 2 =
// 0.68 mm, under the template's 3 mm floor. (Deduction puzzles are drawn not to scale.)
const TILING_112x99 = parseTiling('12 112 99 (56,27,29)(25,2)(31)(17,8)(43,13)(39)(30)');

let t: TestApp;
let admin: TestAgent;
let editor: TestAgent;
let printer: TestAgent;
let puzzles: StubPuzzles;
let setterId: string;
let pubId: string;

beforeAll(async () => {
  t = await createTestApp();
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  admin = await t.signInAs('admin');
  editor = await t.signInAs('editor');
  printer = await t.signInAs('printer');
  setterId = await t.createUser('setter');
  pubId = (await admin.post('/api/publications').send(quadrantPublication).expect(201)).body.id;
  assignPrinters(t, pubId);
  t.clock.set(new Date('2027-03-10T09:00:00Z'));
});
afterAll(() => t.close());

let nextTilingKey = 0;
function printable(tiling = TILING_33x32, kind: 'assembly' | 'deduction' = 'deduction'): string {
  const p = puzzles.add({ tiling, kind, setterId });
  // each its own tiling key, so the reuse guard stays out of these tests
  puzzles.replace({ ...p, tilingKey: `guards-${nextTilingKey++}` });
  return p.id;
}

async function draft(number: number, date: string, puzzleIds: string[] = []) {
  const ed = (await editor.post('/api/editions').send({ publicationId: pubId, number, date, introduction: plainRichText(`No. ${number}`) }).expect(201)).body;
  if (puzzleIds.length === 0) return ed;
  return (await editor.patch(`/api/editions/${ed.id}`).send({ slots: puzzleIds.map((puzzleId) => ({ puzzleId })) }).expect(200)).body;
}

async function approved(number: number, date: string) {
  const ed = await draft(number, date, [printable(TILING_69x61, 'deduction')]);
  await editor.post(`/api/editions/${ed.id}/proofs`).send({ updatedAt: ed.updatedAt }).expect(201);
  await printer.post(`/api/editions/${ed.id}/proofs/1/approve`).expect(200);
  return ed;
}

describe('sending to proof', () => {
  it('refuses an edition without puzzles: nothing stored, no mail, still a draft', async () => {
    const ed = await draft(1, '2027-03-06');
    const checks = (await editor.get(`/api/editions/${ed.id}/checks`).expect(200)).body;
    expect(checks.ok).toBe(false);
    expect(checks.checks).toContainEqual({ code: 'has-slots', ok: false, message: expect.stringMatching(/^No puzzles yet/) });
    const res = await editor.post(`/api/editions/${ed.id}/proofs`).send({ updatedAt: ed.updatedAt }).expect(422);
    expect(res.body.error.details).toContainEqual(expect.objectContaining({ path: 'has-slots', overridable: false }));
    const after = (await editor.get(`/api/editions/${ed.id}`).expect(200)).body;
    expect(after).toMatchObject({ state: 'draft', proofs: [] });
    expect(t.mailbox.all().filter((m) => m.subject.includes('No. 1 '))).toEqual([]);
  });

  it('sends only the saved state the editor saw: a stale updatedAt is a 409', async () => {
    const ed = await draft(2, '2027-03-13', [printable()]);
    const changed = (await editor.patch(`/api/editions/${ed.id}`).send({ introduction: plainRichText('Changed in another tab.') }).expect(200)).body;
    const stale = await editor.post(`/api/editions/${ed.id}/proofs`).send({ updatedAt: ed.updatedAt }).expect(409);
    expect(stale.body.error.message).toMatch(/changed since you loaded it/);
    const sent = await editor.post(`/api/editions/${ed.id}/proofs`).send({ updatedAt: changed.updatedAt }).expect(201);
    expect(sent.body.state).toBe('in_proof');
  });

  it('blocks a proof on the template floors unless the editor gives a reason, which is recorded', async () => {
    const ed = await draft(3, '2027-03-20', [printable(TILING_112x99, 'assembly')]);
    const checks = (await editor.get(`/api/editions/${ed.id}/checks`).expect(200)).body;
    const floor = checks.checks.find((c: { code: string; ok: boolean }) => c.code === 'legibility' && !c.ok);
    expect(floor).toMatchObject({ overridable: true, message: expect.stringMatching(/minimums: .*smallest printed square is 0\.68 mm, under the 3 mm minimum/) });
    // never "passed" beside a broken floor
    expect(checks.checks.some((c: { message: string }) => /passed/i.test(c.message) && /minimum/.test(c.message))).toBe(false);
    const refused = await editor.post(`/api/editions/${ed.id}/proofs`).send({ updatedAt: ed.updatedAt }).expect(422);
    expect(refused.body.error.message).toMatch(/send anyway with a reason/);
    await editor.post(`/api/editions/${ed.id}/proofs`).send({ updatedAt: ed.updatedAt, override: { reason: 'ok' } }).expect(400);
    const sent = await editor
      .post(`/api/editions/${ed.id}/proofs`)
      .send({ updatedAt: ed.updatedAt, override: { reason: 'The 2 piece is cut from card; the printer agreed by phone.' } })
      .expect(201);
    expect(sent.body.overrides).toEqual([
      expect.objectContaining({ kind: 'preflight', proofVersion: 1, reason: 'The 2 piece is cut from card; the printer agreed by phone.', byName: expect.any(String), refused: expect.stringMatching(/3 mm minimum/) }),
    ]);
    const mail = await t.mailbox.waitFor({ to: 'printer@test.squarewright.test', subject: 'Proof 1 ready: The Saturday Quadrant No. 3' });
    expect(mail.text).toMatch(/FAILED with 1 error\(s\) \(sent anyway by the editor, with a reason\)/);
    expect(mail.text).not.toMatch(/passed/);
  });
});

describe('publishing', () => {
  it('refuses before the edition date and ahead of an earlier unpublished edition, says why and what it would make payable', async () => {
    await draft(10, '2027-03-06'); // an earlier edition, still a draft
    const ed = await approved(11, '2027-03-13');
    const check = (await editor.get(`/api/editions/${ed.id}/publish-check`).expect(200)).body;
    expect(check).toMatchObject({ date: '2027-03-13', today: '2027-03-10' });
    expect(check.blockers.map((b: { code: string }) => b.code)).toEqual(['early', 'out-of-order']);
    expect(check.blockers[1].message).toMatch(/No\. 10 \(2027-03-06, draft\)/);
    // quadrantPublication: a Deduction fee is 6000 minor units (GBP)
    expect(check.fees).toEqual({ currency: 'GBP', totalMinor: 6000, entries: [expect.objectContaining({ slot: 1, kind: 'deduction', amountMinor: 6000 })] });

    const refused = await editor.post(`/api/editions/${ed.id}/publish`).send({}).expect(409);
    expect(refused.body.error.message).toMatch(/dated 2027-03-13; today is 2027-03-10/);
    // an editor may not override; an admin must give a reason
    await editor.post(`/api/editions/${ed.id}/publish`).send({ override: { reason: 'The printer ran it early.' } }).expect(403);
    await admin.post(`/api/editions/${ed.id}/publish`).send({ override: { reason: '' } }).expect(400);
    expect((await editor.get(`/api/editions/${ed.id}`).expect(200)).body.state).toBe('approved');

    const done = await admin.post(`/api/editions/${ed.id}/publish`).send({ override: { reason: 'The printer ran it early for the holiday.' } }).expect(200);
    expect(done.body.state).toBe('published');
    expect(done.body.overrides.map((o: { kind: string; reason: string }) => `${o.kind}: ${o.reason}`)).toEqual([
      'publish-early: The printer ran it early for the holiday.',
      'publish-out-of-order: The printer ran it early for the holiday.',
    ]);
  });

  it('counts an edition earlier by number as in the way; publishes on its date without an override when nothing is', async () => {
    const ed = await approved(20, '2027-02-27');
    // No. 10 (2027-03-06) is later by date but earlier by number: it still stands in the way
    const blocked = (await editor.get(`/api/editions/${ed.id}/publish-check`).expect(200)).body;
    expect(blocked.blockers.map((b: { code: string }) => b.code)).toEqual(['out-of-order']);
    const pub2 = (await admin.post('/api/publications').send({ ...quadrantPublication, title: 'Squared Away Monthly', templateId: 'a4' }).expect(201)).body.id;
    assignPrinters(t, pub2);
    const lone = (await editor.post('/api/editions').send({ publicationId: pub2, number: 1, date: '2027-03-10' }).expect(201)).body;
    const withSlot = (await editor.patch(`/api/editions/${lone.id}`).send({ slots: [{ puzzleId: printable(TILING_69x61) }] }).expect(200)).body;
    await editor.post(`/api/editions/${lone.id}/proofs`).send({ updatedAt: withSlot.updatedAt }).expect(201);
    await printer.post(`/api/editions/${lone.id}/proofs/1/approve`).expect(200);
    const res = await editor.post(`/api/editions/${lone.id}/publish`).expect(200);
    expect(res.body).toMatchObject({ state: 'published', overrides: [] });
  });
});

describe('the preflight in words', () => {
  const report = (warnings: PreflightReport['warnings'], ok = true): PreflightReport => ({
    ok,
    templateId: 'a4',
    pages: 2,
    trimMm: { width: 210, height: 297 },
    bleedMm: 3,
    pageSizePt: { width: 612.3, height: 858.9 },
    fontsRegistered: [],
    embeddedFontFiles: 3,
    fontsEmbedded: true,
    smallestSquareMm: 1.32,
    smallestDigitPt: 6,
    omittedLabels: [],
    warnings,
  });

  it('never says passed beside an error, whether the floor is reported as an error or a warning', () => {
    const floorError = report([{ code: 'error:square-small', message: 'smallest printed square is 1.32 mm, under the 3 mm minimum' }], false);
    const floorWarning = report([{ code: 'square-small', message: 'smallest printed square is 1.32 mm, under the 3 mm minimum' }]);
    for (const r of [floorError, floorWarning]) {
      const checks = preflightChecks(r);
      expect(checks).toEqual([{ code: 'legibility', ok: false, overridable: true, message: expect.stringMatching(/^Preflight failed the template's minimums/) }]);
      expect(preflightWords(r, false)).toBe('FAILED with 1 error(s)');
    }
    const fonts = report([{ code: 'error:fonts-not-embedded', message: 'fonts used without embedding: Helvetica' }], false);
    expect(preflightChecks(fonts)).toEqual([{ code: 'legibility', ok: false, message: 'Preflight failed: fonts used without embedding: Helvetica.' }]);
    const clean = report([{ code: 'labels-omitted', message: '2 piece labels left out' }]);
    expect(preflightChecks(clean)).toEqual([{ code: 'legibility', ok: true, message: 'Preflight passed (2 page(s), 1 warning(s)).' }]);
    expect(preflightWords(clean, false)).toBe('passed with 1 warning(s)');
  });
});
