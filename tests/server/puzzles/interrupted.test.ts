import { afterAll, beforeAll, expect, it } from 'vitest';
import { puzzleStartedSchema } from '../../../shared/contracts/puzzles';
import { parseTiling } from '../../../shared/tiling/index';
import { getPuzzle, listPrintablePuzzleIds } from '../../../server/areas/puzzles/puzzles';
import { addToStock } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { SQUARE_112 } from './fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

it('a proof interrupted by a server stop leaves the puzzle failed and not printable, never half-written', async () => {
  const stockId = addToStock(t.db, { tiling: parseTiling(SQUARE_112), provenance: 'demo' }).id;
  const editor = await t.signInAs('editor');
  const { id, jobId } = puzzleStartedSchema.parse((await editor.post('/api/puzzles').send({ stockId, kind: 'deduction', grade: 5 }).expect(202)).body);
  // stop the job system at once, as a shutdown would (the job is queued or running), and start the next one
  await t.restartJobs();
  const runner = t.deps.jobs;
  expect(runner.get(jobId)?.state).toBe('interrupted');
  await new Promise((r) => setTimeout(r, 50));
  const p = getPuzzle(t.deps, runner, id);
  expect(p.status).toBe('failed');
  expect(p.certificate).toBeNull();
  expect(p.certificateCurrent).toBe(false);
  expect(p.givens).toEqual([]);
  expect(listPrintablePuzzleIds(t.db)).toEqual([]);
});
