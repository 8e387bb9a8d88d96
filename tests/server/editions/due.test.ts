import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { quadrantPublication } from './fixtures';
import { TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';

// Issue 16: the editor's Home shows editions due soon with what each still needs.

let t: TestApp;
let editor: TestAgent;
let puzzles: StubPuzzles;
let pubId: string;
beforeAll(async () => {
  t = await createTestApp();
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  editor = await t.signInAs('editor');
  pubId = (await (await t.signInAs('admin')).post('/api/publications').send(quadrantPublication).expect(201)).body.id;
  t.clock.set(new Date('2027-05-03T08:00:00Z'));
});
afterAll(() => t.close());

describe('GET /api/editions/due', () => {
  it('lists unpublished editions dated within the window or overdue, soonest first, with what each needs', async () => {
    const setterId = await t.createUser('setter');
    const stale = puzzles.add({ tiling: TILING_69x61, kind: 'deduction', setterId, current: false });
    const mk = async (number: number, date: string) => (await editor.post('/api/editions').send({ publicationId: pubId, number, date }).expect(201)).body.id as string;
    const overdue = await mk(1, '2027-05-01');
    const soon = await mk(2, '2027-05-08');
    await mk(3, '2027-06-30'); // outside the 14 days
    await editor.patch(`/api/editions/${soon}`).send({ slots: [{ puzzleId: stale.id }] }).expect(200);
    const res = (await editor.get('/api/editions/due').expect(200)).body;
    expect(res.days).toBe(14);
    expect(res.items.map((e: { number: number; daysLeft: number; needs: string[] }) => [e.number, e.daysLeft, e.needs])).toEqual([
      [1, -2, ['puzzles: it has none yet', 'to be sent to proof']],
      [2, 5, ['1 puzzle(s) proved again (certificate out of date)', 'to be sent to proof']],
    ]);
    expect(res.items[0].id).toBe(overdue);
    expect((await editor.get('/api/editions/due?days=60').expect(200)).body.items).toHaveLength(3);
    await editor.get('/api/editions/due?days=abc').expect(400);
    await (await t.signInAs('printer')).get('/api/editions/due').expect(403);
  });
});
