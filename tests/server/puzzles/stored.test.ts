import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { finishProof, getPuzzle, listPuzzles } from '../../../server/areas/puzzles/puzzles';
import { provePuzzle, PUZZLE_JOB_KIND, type PuzzleJobSummary } from '../../../server/areas/puzzles/rules';
import { puzzle } from '../../../server/areas/puzzles/schema';
import { StoredRowError } from '../../../server/platform/db/stored-json';
import { addToStock } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { ORDER_9 } from './fixtures';

// Parse, don't cast: the puzzle table's JSON columns, the proof job's summary and its input
// are read through their schemas; what does not parse is refused with its place named.

let t: TestApp;
let stockId: number;
/** A Deduction puzzle of the order-9 rectangle (ORDER_9), proved at level 2 in-process. */
let made: PuzzleJobSummary;

beforeAll(async () => {
  t = await createTestApp();
  stockId = addToStock(t.db, { tiling: parseTiling(ORDER_9), provenance: 'demo' }).id;
  made = provePuzzle({ kind: 'deduction', tiling: parseTiling(ORDER_9), level: 2, showFrame: false, starters: null, givens: null, grade: null, seed: 1 }, 'make', 1);
});
afterAll(async () => {
  await t.close();
});

/** A new Deduction puzzle row, as createPuzzle leaves it while its first proof runs. */
function provingPuzzle(): number {
  return t.db.insert(puzzle).values({ stockId, kind: 'deduction', title: 'Deduction, 9 squares', status: 'proving', level: '2', inputHash: '' }).returning({ id: puzzle.id }).get().id;
}

const rowOf = (id: number) => t.db.select().from(puzzle).where(eq(puzzle.id, id)).get()!;

describe('a corrupt JSON column', () => {
  // one bad value per column: text that is not JSON, or JSON of the wrong shape
  const corrupt: [column: string, text: string, says: RegExp][] = [
    ['level', '"closure-ish"', /level does not have its stored shape/],
    ['starters_json', 'not json', /starters_json is not JSON/],
    ['givens_json', '[{"x":0,"y":0}]', /givens_json does not have its stored shape: 0\.size/],
    ['steps_json', '{}', /steps_json does not have its stored shape/],
    ['certificate_json', '{"kind":"assembly"}', /certificate_json does not have its stored shape: verdict/],
    ['second_json', '[1,2]', /second_json does not have its stored shape/],
    ['notes_json', '[1]', /notes_json does not have its stored shape: 0/],
    ['recheck_json', '{"holds":"yes","reasons":[]}', /recheck_json does not have its stored shape: holds/],
  ];

  it.each(corrupt)('%s: reading the puzzle raises an error naming the table, the column and the row', (column, text, says) => {
    const id = provingPuzzle();
    finishProof(t.db, id, 1, made, 'done');
    const runner = t.deps.jobs;
    expect(getPuzzle(t.deps, runner, id).status).toBe('unique');
    const setColumn = t.db.$client.prepare(`update puzzle set ${column} = ? where id = ?`);
    const kept = t.db.$client.prepare(`select ${column} as v from puzzle where id = ?`).get(id) as { v: string | null };
    setColumn.run(text, id);
    let caught: unknown;
    try {
      getPuzzle(t.deps, runner, id);
    } catch (e) {
      caught = e;
    } finally {
      // mended, so the other tests' lists read
      setColumn.run(kept.v, id);
    }
    expect(caught).toBeInstanceOf(StoredRowError);
    expect(caught).toMatchObject({ table: 'puzzle', column, rowId: id });
    expect((caught as Error).message).toMatch(new RegExp(`^puzzle ${id}: column `));
    expect((caught as Error).message).toMatch(says);
  });

  it('fails the API request with a 500, never a silent fallback, and the list too when a listed column is corrupt', async () => {
    const id = provingPuzzle();
    finishProof(t.db, id, 1, made, 'done');
    t.db.$client.prepare('update puzzle set certificate_json = ? where id = ?').run('{"verdict":', id);
    const editor = await t.signInAs('editor');
    // the error handler logs it (console.error) and answers without internals
    const logged = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const one = await editor.get(`/api/puzzles/${id}`).expect(500);
    expect(one.body.error.code).toBe('internal');
    await editor.get('/api/puzzles?pageSize=200').expect(500);
    expect(logged.mock.calls.map((c) => c.map(String).join(' ')).join('\n')).toMatch(new RegExp(`StoredRowError: puzzle ${id}: column certificate_json is not JSON`));
    logged.mockRestore();
    expect(() => listPuzzles(t.deps, t.deps.jobs, { page: 1, pageSize: 200, sort: { key: 'id', desc: false } })).toThrow(`puzzle ${id}: column certificate_json is not JSON`);
    expect(() => t.deps.puzzles.getPuzzleForPrint(t.db, String(id))).toThrow(StoredRowError);
    // mended, it reads again
    t.db.$client.prepare('update puzzle set certificate_json = ? where id = ?').run(JSON.stringify(made.certificate), id);
    expect((await editor.get(`/api/puzzles/${id}`).expect(200)).body.certificate).toEqual(made.certificate);
  });
});

describe("the proof job's summary", () => {
  it('a good one is stored: verdict, givens, steps, level and grade', () => {
    const id = provingPuzzle();
    finishProof(t.db, id, 1, made, 'done');
    const p = getPuzzle(t.deps, t.deps.jobs, id);
    expect(p.status).toBe('unique');
    expect(p.certificate).toEqual(made.certificate);
    expect(p.givens).toEqual(made.givens);
    expect(p.steps).toEqual(made.steps);
    expect(p.level).toBe(2);
    expect(p.grade).toBe(made.grade);
  });

  it('a bad one is refused: the proof fails, says why, and nothing of it is stored', () => {
    const id = provingPuzzle();
    const before = rowOf(id);
    const bad = { ...made, certificate: { ...made.certificate, verdict: 'probably' }, givens: [{ x: 0, y: 0 }] };
    finishProof(t.db, id, 1, bad, 'done');
    const p = getPuzzle(t.deps, t.deps.jobs, id);
    expect(p).toMatchObject({ status: 'failed', certificate: null, certificateCurrent: false, givens: [], steps: [], grade: null });
    expect(p.notes).toHaveLength(1);
    expect(p.notes[0]).toMatch(/result was refused/);
    expect(p.notes[0]).toMatch(/certificate\.verdict/);
    expect(p.notes[0]).toMatch(/givens\.0\.size/);
    const after = rowOf(id);
    expect({ ...after, notesJson: before.notesJson, status: before.status, updatedAt: before.updatedAt }).toEqual(before);
  });

  it('a bad one leaves the certificate of the proof before it untouched', () => {
    const id = provingPuzzle();
    finishProof(t.db, id, 1, made, 'done');
    // a re-check starts (same revision) and its summary comes back malformed
    t.db.update(puzzle).set({ status: 'proving' }).where(eq(puzzle.id, id)).run();
    const before = rowOf(id);
    finishProof(t.db, id, 1, { ...made, task: 'recheck', recheck: { holds: 'yes' } }, 'done');
    const after = rowOf(id);
    expect(after.status).toBe('failed');
    expect(after.certificateJson).toBe(before.certificateJson);
    expect(after.givensJson).toBe(before.givensJson);
    expect(after.recheckJson).toBeNull();
    expect(getPuzzle(t.deps, t.deps.jobs, id).notes.join(' ')).toMatch(/recheck\.holds/);
  });

  it('a summary that is not an object at all is refused too', () => {
    const id = provingPuzzle();
    finishProof(t.db, id, 1, 'done', 'done');
    expect(rowOf(id).status).toBe('failed');
    expect(getPuzzle(t.deps, t.deps.jobs, id).notes[0]).toMatch(/\(root\)/);
  });
});

describe("the proof job's input", () => {
  it('is parsed in the worker: a malformed one fails the job with an error naming the puzzle and the place', async () => {
    const runner = t.deps.jobs;
    const jobId = runner.submit({
      kind: PUZZLE_JOB_KIND,
      params: { puzzleId: 4242, revision: 1, task: 'make' },
      input: { kind: 'deduction', tiling: { W: 33, H: 32, squares: 'nine' }, level: 2, showFrame: false, starters: null, givens: null, grade: null, seed: 1 },
    });
    const done = await runner.wait(jobId);
    expect(done.state).toBe('failed');
    expect(done.error).toMatch(/^puzzle 4242: the proof's input is malformed: tiling\.squares/);
  });
});
