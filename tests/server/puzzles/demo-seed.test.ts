import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PuzzleListQuery } from '../../../shared/contracts/puzzles';
import { verifyTiling } from '../../../shared/tiling/index';
import { seedDemoStock } from '../../../server/areas/intake/demo-seed';
import { seedDemoPuzzles } from '../../../server/areas/puzzles/demo-seed';
import { listEditions } from '../../../server/areas/editions/editions';
import { seedDemoEditions } from '../../../server/areas/editions/demo-seed';
import { seedDemoPublications } from '../../../server/areas/editions/publications';
import { getPuzzle, listPrintablePuzzleIds, listPuzzles } from '../../../server/areas/puzzles/puzzles';
import { getStockDetail } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';

let t: TestApp;
let seedMs = 0;
beforeAll(async () => {
  t = await createTestApp({ demo: { seeders: [{ name: 'stock', seed: seedDemoStock }, { name: 'publications', seed: seedDemoPublications }] } });
  const t0 = performance.now();
  seedDemoPuzzles(t.deps);
  seedMs = performance.now() - t0;
});
afterAll(async () => {
  await t.close();
});

const admin = { id: 'x', email: 'a@x', name: 'A', role: 'admin' as const };
/** Every demo puzzle (there are six), oldest first. */
const byId: PuzzleListQuery = { page: 1, pageSize: 50, sort: { key: 'id', desc: false } };
/** The demo puzzles that went into an edition. */
const usedInEditions = () => listPuzzles(t.deps, t.deps.jobs, byId).items.filter((p) => p.usedIn.length > 0);

describe('demo puzzles', () => {
  it('are made from the demo stock, of both kinds, proved unique at seed time, quickly', () => {
    const runner = t.deps.jobs;
    const list = listPuzzles(t.deps, runner, byId);
    expect(list.total).toBe(6);
    expect(new Set(list.items.map((p) => p.kind))).toEqual(new Set(['assembly', 'deduction']));
    // distinct tilings, so the editions' reuse guard lets them all in
    expect(new Set(list.items.map((p) => p.tilingKey)).size).toBe(6);
    for (const s of list.items) {
      const p = getPuzzle(t.deps, runner, s.id);
      expect(p.status).toBe('unique');
      expect(p.certificateCurrent).toBe(true);
      expect(verifyTiling(p.tiling).ok).toBe(true);
      for (const step of p.steps) expect(step.value).toBe(p.tiling.squares[step.square]!.s);
    }
    expect(listPrintablePuzzleIds(t.db)).toHaveLength(6);
    // the demo stock has a perfect order-16 set with two ways to assemble it: one demo Assembly carries starter pieces
    expect(list.items.some((s) => s.kind === 'assembly' && getPuzzle(t.deps, runner, s.id).starters.length > 0)).toBe(true);
    // "keep it fast": under 5 s for all six (our budget for start-up work, common practice)
    expect(seedMs).toBeLessThan(5000);
  });

  it('let the editions seeder publish two editions and send another to proof', async () => {
    await seedDemoEditions(t.deps);
    const states = listEditions(t.deps, admin, {}).map((e) => `${e.publicationTitle} ${e.number} ${e.state}`).sort();
    expect(states).toContain('The Saturday Quadrant 39 published');
    expect(states).toContain('The Saturday Quadrant 40 published');
    expect(states).toContain('The Saturday Quadrant 41 in_proof');
    expect(usedInEditions().length).toBe(6);
  });

  it("show on each stock tiling's history the editions its puzzles went into", () => {
    const runner = t.deps.jobs;
    for (const p of usedInEditions()) {
      const detail = getStockDetail(t.deps, getPuzzle(t.deps, runner, p.id).stockId);
      const expected = p.usedIn.map((u) => `${u.publicationTitle} No. ${u.number}`);
      expect(detail.history.editions.map((e) => e.title)).toEqual(expected);
      expect(detail.history.editions.map((e) => e.id)).toEqual(p.usedIn.map((u) => u.editionId));
    }
  });
});
