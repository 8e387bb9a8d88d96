import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { puzzleDetailSchema, puzzleListSchema, puzzleStartedSchema, type PuzzleCreate, type PuzzleDetail, type PuzzlePatch } from '../../../shared/contracts/puzzles';
import { parseTiling, verifyTiling } from '../../../shared/tiling/index';
import { listPrintablePuzzleIds } from '../../../server/areas/puzzles/puzzles';
import { addToStock } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { ORDER_9, ORDER_9_SIZES, TWIN_13 } from './fixtures';

let t: TestApp;
let order9: number;
let twin13: number;
type Agent = Awaited<ReturnType<TestApp['signInAs']>>;

beforeAll(async () => {
  t = await createTestApp();
  order9 = addToStock(t.db, { tiling: parseTiling(ORDER_9), provenance: 'demo' }).id;
  twin13 = addToStock(t.db, { tiling: parseTiling(TWIN_13), provenance: 'demo' }).id;
});
afterAll(async () => {
  await t.close();
});

async function settled(agent: Agent, id: number, timeoutMs = 60_000): Promise<PuzzleDetail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const p = puzzleDetailSchema.parse((await agent.get(`/api/puzzles/${id}`).expect(200)).body);
    if (p.status !== 'proving') return p;
    if (Date.now() > deadline) throw new Error(`puzzle ${id} still proving`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** POST /api/puzzles (202), then the puzzle once its first proof is done. */
async function made(agent: Agent, body: PuzzleCreate): Promise<PuzzleDetail> {
  const { id } = puzzleStartedSchema.parse((await agent.post('/api/puzzles').send(body).expect(202)).body);
  return settled(agent, id);
}

/** PATCH /api/puzzles/:id (202), then the puzzle once it is proved again. */
async function changed(agent: Agent, id: number, body: PuzzlePatch): Promise<PuzzleDetail> {
  await agent.patch(`/api/puzzles/${id}`).send(body).expect(202);
  return settled(agent, id);
}

describe('puzzles API', () => {
  it('is for editors and admins only', async () => {
    await request(t.app).get('/api/puzzles').expect(401);
    for (const role of ['setter', 'printer'] as const) {
      const a = await t.signInAs(role);
      await a.get('/api/puzzles').expect(403);
      await a.post('/api/puzzles').send({ stockId: order9, kind: 'deduction' }).expect(403);
      await a.get('/api/puzzles/1').expect(403);
      await a.patch('/api/puzzles/1').send({ givens: [] }).expect(403);
      await a.post('/api/puzzles/1/recheck').expect(403);
    }
    await (await t.signInAs('admin')).get('/api/puzzles').expect(200);
  });

  it('refuses bad input and says where', async () => {
    const editor = await t.signInAs('editor');
    const r1 = await editor.post('/api/puzzles').send({ stockId: order9, kind: 'sudoku' }).expect(400);
    expect(JSON.stringify(r1.body.error.details)).toMatch(/body\.kind/);
    const r2 = await editor.post('/api/puzzles').send({ stockId: order9, kind: 'assembly', givens: [{ x: 0, y: 0 }] }).expect(400);
    expect(JSON.stringify(r2.body.error.details)).toMatch(/body\.givens/);
    const r3 = await editor.post('/api/puzzles').send({ stockId: 999_999, kind: 'deduction' }).expect(422);
    expect(JSON.stringify(r3.body.error.details)).toMatch(/body\.stockId/);
    const r4 = await editor.post('/api/puzzles').send({ stockId: order9, kind: 'deduction', givens: [{ x: 0, y: 0 }, { x: 5, y: 5 }] }).expect(422);
    expect(r4.body.error.details).toEqual([{ path: 'body.givens.1', message: expect.stringMatching(/\(5, 5\)/) }]);
    await editor.post('/api/puzzles').send({ stockId: order9, kind: 'deduction', level: 0 }).expect(400);
    await editor.get('/api/puzzles/abc').expect(400);
    await editor.get('/api/puzzles/424242').expect(404);
    await editor.get('/api/puzzles?grade=9').expect(400);
  });

  it('a Deduction puzzle: givens chosen, every step value is the published size, proved unique with a certificate', async () => {
    const editor = await t.signInAs('editor');
    const p = await made(editor, { stockId: order9, kind: 'deduction', level: 2 });
    expect(p.status).toBe('unique');
    // the printed title of a Deduction puzzle must not give the frame's sizes away
    expect(p.title).toBe('Deduction, 9 squares');
    expect(p.certificateCurrent).toBe(true);
    expect(p.certificate?.engineVersion).toMatch(/^puzzle-engine\//);
    expect(p.certificate?.inputHash).toMatch(/^[0-9a-f]{64}$/);
    expect(p.job?.state).toBe('done');
    expect(p.givens.length).toBeGreaterThan(0);
    // the tiling as stored (canonical orientation) still verifies, and its sizes are the published ones
    expect(verifyTiling(p.tiling).ok).toBe(true);
    expect(p.tiling.squares.map((q) => q.s).sort((a, b) => a - b)).toEqual([...ORDER_9_SIZES].sort((a, b) => a - b));
    // every step deduces the true size of its square (sizes from the published code, ORDER_9)
    for (const s of p.steps) expect(s.value).toBe(p.tiling.squares[s.square]!.s);
    // givens + deduced squares cover all nine squares
    const known = new Set([...p.givens.map((g) => `${g.x},${g.y}`), ...p.steps.map((s) => `${p.tiling.squares[s.square]!.x},${p.tiling.squares[s.square]!.y}`)]);
    expect(known.size).toBe(9);
    expect(p.grade).toBeGreaterThanOrEqual(1);
    expect(p.grade).toBeLessThanOrEqual(5);
    expect(listPrintablePuzzleIds(t.db)).toContain(String(p.id));
    const print = t.deps.puzzles.getPuzzleForPrint(t.db, String(p.id));
    expect(print?.certificate?.current).toBe(true);
    expect(print?.deduction?.givens.length).toBe(p.givens.length);
    expect(print?.solution.steps?.length).toBe(p.steps.length);
  });

  it('changing givens proves again; no givens at all is reported as not unique, and that stale puzzle cannot print', async () => {
    const editor = await t.signInAs('editor');
    const first = await made(editor, { stockId: order9, kind: 'deduction' });
    const { id } = first;
    expect(first.status).toBe('unique');
    const firstHash = first.certificate!.inputHash;

    // No sizes printed: the layout alone fixes the sizes only up to scale (a squared rectangle's
    // currents are unique up to a factor: Kirchhoff's laws), so the verdict must be not unique.
    const patched = puzzleStartedSchema.parse((await editor.patch(`/api/puzzles/${id}`).send({ givens: [] }).expect(202)).body);
    expect(patched.jobId).not.toBe(first.job!.id);
    const during = puzzleDetailSchema.parse((await editor.get(`/api/puzzles/${id}`).expect(200)).body);
    if (during.status === 'proving') {
      expect(during.certificateCurrent).toBe(false);
      expect(t.deps.puzzles.getPuzzleForPrint(t.db, String(id))?.certificate?.current).toBe(false);
    }
    const none = await settled(editor, id);
    expect(none.status).toBe('not-unique');
    expect(none.certificate?.verdict).toBe('not-unique');
    expect(none.certificate?.inputHash).not.toBe(firstHash);
    expect(none.certificateCurrent).toBe(false);
    expect(none.staleReasons.join(' ')).toMatch(/not unique/);
    expect(listPrintablePuzzleIds(t.db)).not.toContain(String(id));
    const print = t.deps.puzzles.getPuzzleForPrint(t.db, String(id));
    expect(print?.certificate?.current).toBe(false);

    // one printed size fixes the scale: the rank proof says unique (same fact, other side),
    // whether or not local steps reach every size ('stuck' is printable never)
    const corner = none.tiling.squares[0]!;
    const one = await changed(editor, id, { givens: [{ x: corner.x, y: corner.y }], level: 'closure' });
    expect(['unique', 'stuck']).toContain(one.status);
    expect(one.certificate?.counts.rank).toBe(one.certificate?.counts.unknowns);
    expect(one.givens).toEqual([{ x: corner.x, y: corner.y, size: corner.s }]);
    expect(one.level).toBe('closure');

    // back to the engine's givens at level 3: unique, current, and the same input hash as before
    const back = await changed(editor, id, { givens: first.givens.map(({ x, y }) => ({ x, y })), level: 3 });
    expect(back.status).toBe('unique');
    expect(back.certificateCurrent).toBe(true);
    expect(back.certificate?.inputHash).toBe(firstHash);
  });

  it('an edition refuses a stale puzzle; proved again it goes to proof, and then it is locked', async () => {
    const editor = await t.signInAs('editor');
    const admin = await t.signInAs('admin');
    const pub = await admin.post('/api/publications').send({
      title: 'The Saturday Quadrant', publisher: 'Larkspur & Quill Press', templateId: 'newspaper-column', cadence: 'weekly',
      solutionRule: 'same_edition', reuseWindowDays: 90, currency: 'GBP', feeAssemblyMinor: 4500, feeDeductionMinor: 6000,
    }).expect(201);
    const ed = await editor.post('/api/editions').send({ publicationId: pub.body.id, number: 7, date: '2026-12-05' }).expect(201);
    const p = await made(editor, { stockId: order9, kind: 'deduction', givens: [] });
    const { id } = p;
    expect(p.status).toBe('not-unique');
    await editor.patch(`/api/editions/${ed.body.id}`).send({ slots: [{ puzzleId: String(id) }] }).expect(200);
    const checks = (await editor.get(`/api/editions/${ed.body.id}/checks`).expect(200)).body as { ok: boolean; checks: { code: string; ok: boolean; slot?: number; message: string }[] };
    expect(checks.ok).toBe(false);
    expect(checks.checks).toContainEqual(expect.objectContaining({ code: 'certificate', ok: false, slot: 1 }));
    await editor.post(`/api/editions/${ed.body.id}/proofs`).expect(422);

    // print every size: trivially deduced, proved unique again, current
    expect((await changed(editor, id, { givens: p.tiling.squares.map(({ x, y }) => ({ x, y })) })).status).toBe('unique');
    const again = (await editor.get(`/api/editions/${ed.body.id}/checks`).expect(200)).body as typeof checks;
    expect(again.checks.filter((c) => c.code === 'certificate').every((c) => c.ok)).toBe(true);
    await editor.post(`/api/editions/${ed.body.id}/proofs`).expect(201);
    const listed = puzzleListSchema.parse((await editor.get(`/api/puzzles?pageSize=200`).expect(200)).body).items.find((x) => x.id === id)!;
    expect(listed.usedIn).toEqual([expect.objectContaining({ publicationTitle: 'The Saturday Quadrant', number: 7, state: 'in_proof' })]);
    // in proof: the puzzle may no longer change
    await editor.patch(`/api/puzzles/${id}`).send({ givens: [] }).expect(409);
  });

  it('an Assembly puzzle of a set with two ways gets the fewest starter pieces; without them it is reported multiple', async () => {
    const editor = await t.signInAs('editor');
    const p = await made(editor, { stockId: twin13, kind: 'assembly' });
    const { id } = p;
    // TWIN_13: the bare 13 sizes assemble in two ways (published), so starters are needed
    expect(p.status).toBe('unique');
    expect(p.starters.length).toBeGreaterThanOrEqual(1);
    expect(p.notes.join(' ')).toMatch(/starter piece/);
    expect(p.certificateCurrent).toBe(true);

    const bare = await changed(editor, id, { starters: [] });
    expect(bare.status).toBe('multiple');
    expect(bare.certificate?.counts.classes).toBe(2);
    expect(bare.second).not.toBeNull();
    expect(verifyTiling(bare.second!.tiling).ok).toBe(true);
    expect(bare.certificateCurrent).toBe(false);

    // the engine proposes again: unique with starter pieces once more
    await editor.patch(`/api/puzzles/${id}`).send({ propose: true, starters: [] }).expect(400);
    const proposed = await changed(editor, id, { propose: true });
    expect(proposed.status).toBe('unique');
    expect(proposed.starters.length).toBeGreaterThanOrEqual(1);
    expect(proposed.certificateCurrent).toBe(true);

    const bad = await editor.patch(`/api/puzzles/${id}`).send({ givens: [] }).expect(422);
    expect(JSON.stringify(bad.body.error.details)).toMatch(/body\.givens/);
  });

  it('a second change while the first is still being proved wins; cancel needs a running proof', async () => {
    const editor = await t.signInAs('editor');
    const first = await made(editor, { stockId: order9, kind: 'deduction' });
    const { id } = first;
    await editor.post(`/api/puzzles/${id}/cancel`).expect(409);
    await editor.patch(`/api/puzzles/${id}`).send({ givens: [] }).expect(202);
    await editor.patch(`/api/puzzles/${id}`).send({ givens: first.tiling.squares.map(({ x, y }) => ({ x, y })) }).expect(202);
    const last = await settled(editor, id);
    expect(last.status).toBe('unique');
    expect(last.givens).toHaveLength(9);
    expect(last.certificateCurrent).toBe(true);
  });

  it('recheck recomputes the certificate and it holds', async () => {
    const editor = await t.signInAs('editor');
    const p = await made(editor, { stockId: order9, kind: 'assembly' });
    const { id } = p;
    expect(['unique', 'multiple']).toContain(p.status);
    await editor.post(`/api/puzzles/${id}/recheck`).expect(202);
    const r = await settled(editor, id);
    expect(r.lastRecheck?.holds).toBe(true);
    expect(r.status).toBe(p.status);
    expect(r.certificate?.inputHash).toBe(p.certificate?.inputHash);
  });

  it('lists with filters, sort and pages', async () => {
    const editor = await t.signInAs('editor');
    const all = puzzleListSchema.parse((await editor.get('/api/puzzles?pageSize=200').expect(200)).body);
    expect(all.total).toBe(all.items.length);
    const ded = puzzleListSchema.parse((await editor.get('/api/puzzles?kind=deduction&pageSize=200').expect(200)).body);
    expect(ded.items.every((p) => p.kind === 'deduction')).toBe(true);
    expect(ded.total).toBe(all.items.filter((p) => p.kind === 'deduction').length);
    const printable = puzzleListSchema.parse((await editor.get('/api/puzzles?printable=true&pageSize=200').expect(200)).body);
    expect(printable.items.every((p) => p.certificateCurrent)).toBe(true);
    const page2 = puzzleListSchema.parse((await editor.get('/api/puzzles?pageSize=1&page=2&sort=id').expect(200)).body);
    expect(page2.items[0]!.id).toBe([...all.items].sort((a, b) => a.id - b.id)[1]!.id);
    const forStock = puzzleListSchema.parse((await editor.get(`/api/puzzles?stockId=${twin13}`).expect(200)).body);
    expect(forStock.items.every((p) => p.stockId === twin13 && p.width === 112 && p.height === 75)).toBe(true);
  });
});
