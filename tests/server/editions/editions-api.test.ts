import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText } from '../../../shared/contracts/editions';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { assignPrinters, quadrantPublication } from './fixtures';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';
import { hasPoppler, pdftotext, writeTemp } from '../print/poppler';

// The print API end to end on a fresh database: publications, editions, the state
// machine, the proof round with stored, hashed files and mails, and who may see what.

let t: TestApp;
let admin: TestAgent;
let editor: TestAgent;
let printer: TestAgent;
let setter: TestAgent;
let setterId: string;
let puzzles: StubPuzzles;
// the stub puzzles' ids (puzzle row ids, as the API spells them)
let pzA: string;
let pzD: string;
let pzSameTiling: string;
let pzStale: string;

function binary(res: request.Response, cb: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

beforeAll(async () => {
  t = await createTestApp();
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  admin = await t.signInAs('admin');
  editor = await t.signInAs('editor');
  printer = await t.signInAs('printer');
  setter = await t.signInAs('setter');
  setterId = await t.createUser('setter');
  pzA = puzzles.add({ tiling: TILING_69x61, kind: 'assembly', setterId }).id;
  pzD = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId }).id;
  pzSameTiling = puzzles.add({ tiling: TILING_33x32, kind: 'assembly', setterId }).id;
  pzStale = puzzles.add({ tiling: TILING_69x61, kind: 'deduction', setterId, current: false }).id;
});
afterAll(() => t.close());

const pubBody = quadrantPublication;
/** The editor's reason for sending past the preflight's floor errors (issue 16). */
const override = { reason: 'The small pieces are cut from card; the printer agreed.' };

describe('publications', () => {
  it('lets an admin create and change one, and refuses an unknown template by field', async () => {
    const created = await admin.post('/api/publications').send(pubBody).expect(201);
    expect(created.body).toMatchObject({ title: 'The Saturday Quadrant', templateId: 'newspaper-column' });
    const bad = await admin.post('/api/publications').send({ ...pubBody, title: 'Other', templateId: 'tabloid' }).expect(422);
    expect(bad.body.error.details).toEqual([{ path: 'body.templateId', message: expect.stringMatching(/a4, newspaper-column, us-letter/) }]);
    const neg = await admin.post('/api/publications').send({ ...pubBody, title: 'Other', feeAssemblyMinor: -1 }).expect(400);
    expect(JSON.stringify(neg.body.error.details)).toMatch(/body\.feeAssemblyMinor/);
    await admin.post('/api/publications').send(pubBody).expect(409);
    const patched = await admin.patch(`/api/publications/${created.body.id}`).send({ reuseWindowDays: 120 }).expect(200);
    expect(patched.body.reuseWindowDays).toBe(120);
  });

  it('is for admins to change, editors to read, and nobody else', async () => {
    await editor.post('/api/publications').send({ ...pubBody, title: 'X' }).expect(403);
    await editor.get('/api/publications').expect(200);
    await printer.get('/api/publications').expect(403);
    await setter.get('/api/publications').expect(403);
    await request(t.app).get('/api/publications').expect(401);
  });
});

describe('the edition round', () => {
  let pubId: string;
  let edId: string;

  beforeAll(async () => {
    pubId = (await editor.get('/api/publications')).body.items[0].id;
    assignPrinters(t, pubId);
  });

  it('creates a draft and refuses a duplicate number', async () => {
    const res = await editor.post('/api/editions').send({ publicationId: pubId, number: 41, date: '2026-12-05', introduction: plainRichText('Welcome.') }).expect(201);
    expect(res.body).toMatchObject({ state: 'draft', number: 41, slots: [], proofs: [] });
    edId = res.body.id;
    await editor.post('/api/editions').send({ publicationId: pubId, number: 41, date: '2026-12-12' }).expect(409);
    await editor.post('/api/editions').send({ publicationId: pubId, number: 42, date: '2026-02-30' }).expect(400);
  });

  it('says when an edition has no puzzles, and refuses slots naming unknown puzzles', async () => {
    const res = await editor.get(`/api/editions/${edId}/checks`).expect(200);
    expect(res.body.checks).toContainEqual({ code: 'has-slots', ok: false, message: expect.stringMatching(/^No puzzles yet/) });
    await editor.post(`/api/editions/${edId}/proofs`).expect(422);
    const bad = await editor.patch(`/api/editions/${edId}`).send({ slots: [{ puzzleId: 'nope' }] }).expect(422);
    expect(bad.body.error.details).toEqual([{ path: 'body.slots.0.puzzleId', message: 'no puzzle nope' }]);
    const dup = await editor.patch(`/api/editions/${edId}`).send({ slots: [{ puzzleId: pzA }, { puzzleId: pzA }] }).expect(400);
    expect(JSON.stringify(dup.body.error.details)).toMatch(/body\.slots\.1\.puzzleId/);
  });

  it('runs the checks: a stale certificate and a repeated tiling fail', async () => {
    await editor.patch(`/api/editions/${edId}`).send({ slots: [{ puzzleId: pzD }, { puzzleId: pzSameTiling }, { puzzleId: pzStale }] }).expect(200);
    const checks = (await editor.get(`/api/editions/${edId}/checks`).expect(200)).body;
    expect(checks.ok).toBe(false);
    const failed = checks.checks.filter((c: { ok: boolean }) => !c.ok).map((c: { code: string; slot?: number }) => `${c.code}:${c.slot ?? ''}`);
    expect(failed).toContain('certificate:3');
    expect(failed).toContain('reuse:2');
    await editor.post(`/api/editions/${edId}/proofs`).expect(422);
  });

  it('reorders slots, then sends proof 1: stored, hashed, printers mailed', async () => {
    const res = await editor
      .patch(`/api/editions/${edId}`)
      .send({ slots: [{ puzzleId: pzD, instructions: plainRichText('Find every size.') }, { puzzleId: pzA }] })
      .expect(200);
    expect(res.body.slots.map((s: { puzzleId: string }) => s.puzzleId)).toEqual([pzD, pzA]);
    const reordered = await editor.patch(`/api/editions/${edId}`).send({ slots: [{ puzzleId: pzA }, { puzzleId: pzD, instructions: plainRichText('Find every size.') }] }).expect(200);
    expect(reordered.body.slots.map((s: { position: number; puzzleId: string }) => `${s.position}:${s.puzzleId}`)).toEqual([`1:${pzA}`, `2:${pzD}`]);
    const checks = (await editor.get(`/api/editions/${edId}/checks`).expect(200)).body;
    // the Assembly's half-scale 2-piece breaks the newspaper column's 3 mm floor: the one
    // failed check is the preflight's, which the editor may send past with a reason
    expect(checks.checks.filter((c: { ok: boolean }) => !c.ok), JSON.stringify(checks.checks)).toEqual([expect.objectContaining({ code: 'legibility', overridable: true })]);
    await editor.post(`/api/editions/${edId}/proofs`).expect(422);

    const sent = await editor.post(`/api/editions/${edId}/proofs`).send({ override }).expect(201);
    expect(sent.body.state).toBe('in_proof');
    expect(sent.body.proofs).toHaveLength(1);
    const proof = sent.body.proofs[0];
    expect(proof).toMatchObject({ version: 1, status: 'pending' });
    const dir = join(t.deps.env.DATA_DIR, 'proofs', edId);
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    expect(readdirSync(dir).filter((f) => /^proof-v1-[0-9a-f]{8}\.pdf$/.test(f))).toHaveLength(1);

    const file = await printer.get(`/api/editions/${edId}/proofs/1.pdf`).buffer(true).parse(binary).expect(200);
    expect(file.headers['content-type']).toMatch(/application\/pdf/);
    // the stored hash is the SHA-256 (FIPS 180-4, via Node's crypto) of the served bytes
    expect(createHash('sha256').update(file.body as Buffer).digest('hex')).toBe(proof.sha256);
    if (hasPoppler) expect(pdftotext(writeTemp(file.body as Buffer))).toMatch(/PROOF v1/);

    const mail = await t.mailbox.waitFor({ to: 'printer@test.squarewright.test', subject: 'Proof 1 ready' });
    expect(mail.text).toContain(proof.sha256);
    expect(mail.text).toContain('check every page of a proof before it goes to press');
  });

  it('refuses illegal moves with 409', async () => {
    await editor.patch(`/api/editions/${edId}`).send({ number: 43 }).expect(409);
    await editor.post(`/api/editions/${edId}/proofs`).expect(409);
    await editor.post(`/api/editions/${edId}/publish`).expect(409);
    await printer.post(`/api/editions/${edId}/proofs/2/approve`).expect(404);
  });

  it('lets the printer return it with notes: back to draft, editor mailed', async () => {
    await editor.post(`/api/editions/${edId}/proofs/1/return`).send({ notes: 'x' }).expect(403);
    await printer.post(`/api/editions/${edId}/proofs/1/return`).send({ notes: '   ' }).expect(400);
    const res = await printer.post(`/api/editions/${edId}/proofs/1/return`).send({ notes: 'Puzzle 2 drawing sits too close to the fold.' }).expect(200);
    expect(res.body.state).toBe('draft');
    expect(res.body).not.toHaveProperty('slots');
    const mail = await t.mailbox.waitFor({ to: 'editor@test.squarewright.test', subject: 'Proof 1 returned' });
    expect(mail.text).toContain('too close to the fold');
    const ed = (await editor.get(`/api/editions/${edId}`).expect(200)).body;
    expect(ed.returnNotes).toContain('fold');
    expect(ed.proofs[0]).toMatchObject({ status: 'returned', notes: 'Puzzle 2 drawing sits too close to the fold.' });
    await printer.post(`/api/editions/${edId}/proofs/1/approve`).expect(409);
  });

  it('resends as proof 2; the printer approves; the press file has no stamp and its own hash', async () => {
    await editor.patch(`/api/editions/${edId}`).send({ introduction: plainRichText('Welcome back.') }).expect(200);
    const sent = await editor.post(`/api/editions/${edId}/proofs`).send({ override }).expect(201);
    expect(sent.body.proofs.map((p: { version: number; status: string }) => `${p.version}:${p.status}`)).toEqual(['1:returned', '2:pending']);
    // a change to a puzzle after the proof went out must not reach the press file
    const original = puzzles.get(pzA);
    puzzles.replace({ ...original, title: 'Changed after the proof' });
    const ok = await printer.post(`/api/editions/${edId}/proofs/2/approve`).expect(200);
    puzzles.replace(original);
    expect(ok.body.state).toBe('approved');
    expect(ok.body.pressFile).toMatchObject({ version: 2 });
    const press = await printer.get(`/api/editions/${edId}/press.pdf`).buffer(true).parse(binary).expect(200);
    expect(createHash('sha256').update(press.body as Buffer).digest('hex')).toBe(ok.body.pressFile.sha256);
    if (hasPoppler) {
      const text = pdftotext(writeTemp(press.body as Buffer));
      expect(text).not.toMatch(/PROOF/);
      expect(text).toContain('Welcome back.');
      expect(text).toContain(`assembly ${pzA}`);
      expect(text).not.toContain('Changed after the proof');
    }
    await t.mailbox.waitFor({ to: 'editor@test.squarewright.test', subject: 'Proof 2 approved' });
  });

  it('publishes and records a fee per printed puzzle at the publication rate', async () => {
    await printer.post(`/api/editions/${edId}/publish`).expect(403);
    t.clock.set(new Date('2026-12-05T10:00:00Z')); // the edition's date: publishing before it is refused (guards.test.ts)
    const res = await editor.post(`/api/editions/${edId}/publish`).expect(200);
    expect(res.body.state).toBe('published');
    const { ledgerEntry } = await import('../../../server/areas/payouts/schema');
    const rows = t.db.select({ puzzleId: ledgerEntry.puzzleId, amount: ledgerEntry.amountMinor, currency: ledgerEntry.currency, setterId: ledgerEntry.setterId }).from(ledgerEntry).all();
    expect(rows.sort((a, b) => String(a.puzzleId).localeCompare(String(b.puzzleId)))).toEqual([
      { puzzleId: pzA, amount: 4500, currency: 'GBP', setterId },
      { puzzleId: pzD, amount: 6000, currency: 'GBP', setterId },
    ].sort((a, b) => a.puzzleId.localeCompare(b.puzzleId)));
    await editor.post(`/api/editions/${edId}/publish`).expect(409);
  });

  it('guards the solution-once rule and the reuse window across editions', async () => {
    const next = await editor.post('/api/editions').send({ publicationId: pubId, number: 42, date: '2026-12-12' }).expect(201);
    await editor.patch(`/api/editions/${next.body.id}`).send({ slots: [{ puzzleId: pzA }, { puzzleId: pzSameTiling }] }).expect(200);
    const checks = (await editor.get(`/api/editions/${next.body.id}/checks`).expect(200)).body;
    const failed = checks.checks.filter((c: { ok: boolean }) => !c.ok).map((c: { code: string }) => c.code);
    expect(failed).toContain('solution-once'); // puzzle pzA is in No. 41
    expect(failed).toContain('reuse'); // the 33 x 32 tiling was in No. 41, 7 days before
  });
});

describe('roles, route by route', () => {
  it('keeps drafts from printers and everything from setters, including direct file URLs', async () => {
    const pubId = (await editor.get('/api/publications')).body.items[0].id;
    const draft = await editor.post('/api/editions').send({ publicationId: pubId, number: 90, date: '2027-01-02' }).expect(201);
    const list = (await printer.get('/api/editions').expect(200)).body.items.map((e: { number: number }) => e.number);
    expect(list).toContain(41);
    expect(list).not.toContain(90);
    await printer.get(`/api/editions/${draft.body.id}`).expect(404);
    await printer.get(`/api/editions/${draft.body.id}/proofs/1.pdf`).expect(404);
    await printer.get(`/api/editions/${draft.body.id}/checks`).expect(403);
    await printer.get(`/api/editions/${draft.body.id}/preview.pdf`).expect(403);
    await printer.patch(`/api/editions/${draft.body.id}`).send({ number: 91 }).expect(403);
    await printer.get('/api/stock').expect(403);
    await printer.get('/api/templates').expect(403);
    for (const path of ['/api/editions', `/api/editions/${draft.body.id}`, `/api/editions/${draft.body.id}/proofs/1.pdf`, `/api/editions/${draft.body.id}/press.pdf`, '/api/templates']) {
      await setter.get(path).expect(403);
      await request(t.app).get(path).expect(401);
    }
  });

  it('shows printers no setters, fees or puzzle ids', async () => {
    const list = (await printer.get('/api/editions').expect(200)).body.items;
    const id = list.find((e: { number: number }) => e.number === 41).id;
    const body = JSON.stringify((await printer.get(`/api/editions/${id}`).expect(200)).body);
    expect(body).not.toContain(setterId);
    // no puzzle: neither an id (as the API spells it, a quoted string of digits) nor a title, nor a field naming one
    for (const id of [pzA, pzD]) expect(body).not.toContain(`"${id}"`);
    expect(body).not.toContain(`assembly ${pzA}`);
    expect(body).not.toMatch(/"(puzzle[a-z]*|slots)"\s*:/i);
    // no field about fees or money (checked on keys: a hex hash may contain "fee")
    expect(body).not.toMatch(/"[a-z]*(fee|amount|currency)[a-z]*"\s*:/i);
    expect(body).not.toMatch(/"setter[a-z]*"\s*:/i);
  });
});

describe('the solution rule', () => {
  it('prints the previous edition’s solutions under "next edition", with where the puzzle ran', async () => {
    const { loadEditionDocument } = await import('../../../server/areas/editions/edition-document');
    const pub = await admin
      .post('/api/publications')
      .send({ ...pubBody, title: 'Squared Away Monthly', templateId: 'a4', cadence: 'monthly', solutionRule: 'next_edition' })
      .expect(201);
    const first = await editor.post('/api/editions').send({ publicationId: pub.body.id, number: 1, date: '2027-01-01' }).expect(201);
    await editor.patch(`/api/editions/${first.body.id}`).send({ slots: [{ puzzleId: pzStale }] }).expect(200);
    const second = await editor.post('/api/editions').send({ publicationId: pub.body.id, number: 2, date: '2027-02-01' }).expect(201);
    const doc1 = loadEditionDocument(t.deps, first.body.id).doc;
    const doc2 = loadEditionDocument(t.deps, second.body.id).doc;
    expect(doc1.puzzles).toHaveLength(1);
    expect(doc1.solutions).toEqual([]);
    expect(doc2.puzzles).toEqual([]);
    expect(doc2.solutions).toEqual([expect.objectContaining({ slot: 1, caption: 'No. 1, puzzle 1', tiling: TILING_69x61 })]);
  });
});

describe('racing requests', () => {
  it('sends one proof when two requests race, and keeps its file', async () => {
    const pubId = (await editor.get('/api/publications')).body.items.find((p: { title: string }) => p.title === 'The Saturday Quadrant').id;
    const ed = await editor.post('/api/editions').send({ publicationId: pubId, number: 77, date: '2027-06-05' }).expect(201);
    const own = puzzles.add({ tiling: TILING_69x61, kind: 'deduction', setterId });
    puzzles.replace({ ...own, tilingKey: 'racing-own-key' });
    await editor.patch(`/api/editions/${ed.body.id}`).send({ slots: [{ puzzleId: own.id }] }).expect(200);
    const [a, b] = await Promise.all([editor.post(`/api/editions/${ed.body.id}/proofs`), editor.post(`/api/editions/${ed.body.id}/proofs`)]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const file = await editor.get(`/api/editions/${ed.body.id}/proofs/1.pdf`).buffer(true).parse(binary).expect(200);
    const stored = (await editor.get(`/api/editions/${ed.body.id}`).expect(200)).body.proofs;
    expect(stored).toHaveLength(1);
    expect(createHash('sha256').update(file.body as Buffer).digest('hex')).toBe(stored[0].sha256);
    const dir = join(t.deps.env.DATA_DIR, 'proofs', ed.body.id);
    expect(readdirSync(dir)).toHaveLength(1);
  });
});
