import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { puzzleDetailSchema, puzzleStartedSchema } from '../../../shared/contracts/puzzles';
import { parseTiling } from '../../../shared/tiling/index';
import { finishProof, getPuzzle, listPrintablePuzzleIds } from '../../../server/areas/puzzles/puzzles';
import { puzzle } from '../../../server/areas/puzzles/schema';
import { addToStock } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { SQUARE_112 } from '../puzzles/fixtures';

// A re-check that does not finish (cancelled, failed, cut off by a server stop) never demotes a
// valid certificate (issue 15: on main an interrupted or failed re-check marked a puzzle
// 'failed' and dropped it from the printable list although its certificate said unique). The
// last good certificate stays in force and the unfinished attempt is recorded beside it; the
// printable list and the certificate's "current" always agree. The 112 x 112 order-21 square
// (OEIS A014530) makes a unique Assembly puzzle (README, puzzle benchmarks).

let t: TestApp;
let id: number;
let certificateJson: string | null;

async function detail() {
  return puzzleDetailSchema.parse((await (await t.signInAs('editor')).get(`/api/puzzles/${id}`).expect(200)).body);
}

/** The puzzle's certificate is "current" exactly when the puzzle is on the printable list. */
async function expectAgreement() {
  const d = await detail();
  expect(listPrintablePuzzleIds(t.db).includes(String(id))).toBe(d.certificateCurrent);
  return d;
}

async function expectInForce(state: 'failed' | 'cancelled' | 'interrupted') {
  const d = await expectAgreement();
  expect(d.status).toBe('unique');
  expect(d.certificateCurrent).toBe(true);
  expect(d.staleReasons).toEqual([]);
  expect(listPrintablePuzzleIds(t.db)).toContain(String(id));
  expect(t.db.select({ c: puzzle.certificateJson }).from(puzzle).where(eq(puzzle.id, id)).get()?.c).toBe(certificateJson);
  expect(d.lastUnfinishedRecheck?.state).toBe(state);
}

beforeAll(async () => {
  t = await createTestApp();
  const stockId = addToStock(t.db, { tiling: parseTiling(SQUARE_112), provenance: 'demo' }).id;
  const editor = await t.signInAs('editor');
  const started = puzzleStartedSchema.parse((await editor.post('/api/puzzles').send({ stockId, kind: 'assembly' }).expect(202)).body);
  id = started.id;
  expect((await t.deps.jobs.wait(started.jobId)).state).toBe('done');
  const d = await expectAgreement();
  expect(d.status).toBe('unique');
  expect(d.certificateCurrent).toBe(true);
  certificateJson = t.db.select({ c: puzzle.certificateJson }).from(puzzle).where(eq(puzzle.id, id)).get()?.c ?? null;
  expect(certificateJson).not.toBeNull();
});
afterAll(() => t.close());

describe('a re-check that does not finish', () => {
  it('cancelled: the certificate stays in force, the attempt is recorded', async () => {
    const editor = await t.signInAs('editor');
    const { jobId } = puzzleStartedSchema.parse((await editor.post(`/api/puzzles/${id}/recheck`).expect(202)).body);
    await editor.post(`/api/puzzles/${id}/cancel`).expect((r) => expect([200, 204, 409]).toContain(r.status));
    const end = await t.deps.jobs.wait(jobId);
    if (end.state === 'done') {
      // the re-check was faster than the cancel: it held, nothing to see here; cancel in the sink instead
      t.db.update(puzzle).set({ status: 'proving' }).where(eq(puzzle.id, id)).run();
      finishProof(t.db, id, 1, null, 'cancelled', 'recheck');
    }
    await expectInForce('cancelled');
  });

  it('interrupted by a server stop: the certificate stays in force, the attempt is recorded', async () => {
    const editor = await t.signInAs('editor');
    const { jobId } = puzzleStartedSchema.parse((await editor.post(`/api/puzzles/${id}/recheck`).expect(202)).body);
    await t.restartJobs();
    const state = t.deps.jobs.get(jobId)?.state;
    if (state === 'done') {
      t.db.update(puzzle).set({ status: 'proving' }).where(eq(puzzle.id, id)).run();
      finishProof(t.db, id, 1, 'not a summary', 'done', 'recheck');
      await expectInForce('failed');
      return;
    }
    expect(state).toBe('interrupted');
    await expectInForce('interrupted');
  });

  it('failed (a result that does not parse): the certificate stays in force, the attempt is recorded', async () => {
    t.db.update(puzzle).set({ status: 'proving' }).where(eq(puzzle.id, id)).run();
    finishProof(t.db, id, 1, { task: 'recheck', nonsense: true }, 'done', 'recheck');
    await expectInForce('failed');
  });

  it('a re-check that finishes and holds clears the unfinished attempt', async () => {
    const editor = await t.signInAs('editor');
    const { jobId } = puzzleStartedSchema.parse((await editor.post(`/api/puzzles/${id}/recheck`).expect(202)).body);
    expect((await t.deps.jobs.wait(jobId)).state).toBe('done');
    const d = await expectAgreement();
    expect(d.status).toBe('unique');
    expect(d.lastRecheck?.holds).toBe(true);
    expect(d.lastUnfinishedRecheck).toBeNull();
  });

  it('a failed PROOF of a new revision is still failed (only re-checks keep the verdict), and the list agrees', async () => {
    t.db.update(puzzle).set({ status: 'proving' }).where(eq(puzzle.id, id)).run();
    finishProof(t.db, id, 1, 'not a summary', 'done', 'prove');
    const d = getPuzzle(t.deps, t.deps.jobs, id);
    expect(d.status).toBe('failed');
    // the certificate is for exactly this input, so it is still current, and printable agrees
    expect(listPrintablePuzzleIds(t.db).includes(String(id))).toBe(d.certificateCurrent);
  });
});
