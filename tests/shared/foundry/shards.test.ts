import { describe, expect, it } from 'vitest';
import { canonicalKey, parseTiling, solvePlaneNetwork } from '../../../shared/tiling/index';
import { exhaustiveTilings, type ExhaustiveSummary } from '../../../shared/foundry/exhaustive';
import { cNetOf, cNetsOf, crossPoints, isThreeConnected } from '../../../shared/foundry/tiling-networks';

// OEIS A002839 (simple perfect squared rectangles, squares included) and A002881 (simple
// imperfect), n = 13..15.
const A002839: Record<number, number> = { 13: 213, 14: 744, 15: 2609 };
const A002881: Record<number, number> = { 13: 34, 14: 104, 15: 283 };

function run(order: number, shard?: { index: number; count: number }) {
  const keys: string[] = [];
  const s = exhaustiveTilings({ order, ...(shard ? { shard } : {}), onFound: (t) => keys.push(t.key) });
  return { s, keys };
}

const additive = ['graphs', 'pairs', 'zeroCurrent', 'simplePerfect', 'simpleImperfect', 'compound', 'squares'] as const;

describe('exhaustive runs in shards', () => {
  it('the shards of a run are disjoint, and together give the whole run and the OEIS counts', () => {
    for (const [order, count] of [[13, 2], [14, 3], [15, 4]] as const) {
      const whole = run(order);
      const sum = Object.fromEntries(additive.map((k) => [k, 0])) as Record<(typeof additive)[number], number>;
      const keys: string[] = [];
      for (let index = 0; index < count; index++) {
        const part = run(order, { index, count });
        for (const k of additive) sum[k] += part.s[k as keyof ExhaustiveSummary] as number;
        keys.push(...part.keys);
      }
      expect(new Set(keys).size).toBe(keys.length);
      expect(keys.sort()).toEqual([...whole.keys].sort());
      for (const k of additive) expect({ order, k, v: sum[k] }).toEqual({ order, k, v: whole.s[k] });
      // Sources: OEIS A002839 and A002881.
      expect([sum.simplePerfect, sum.simpleImperfect]).toEqual([A002839[order], A002881[order]]);
    }
  });

  it('each shard is deterministic', () => {
    expect(run(14, { index: 1, count: 3 }).keys).toEqual(run(14, { index: 1, count: 3 }).keys);
  });

  it('refuses a shard outside 0 <= index < count', () => {
    expect(() => exhaustiveTilings({ order: 9, shard: { index: 2, count: 2 } })).toThrow(/shard must be/);
    expect(() => exhaustiveTilings({ order: 9, shard: { index: 0, count: 0 } })).toThrow(/shard must be/);
  });
});

describe('the c-nets of a tiling with a cross', () => {
  // A simple perfect squared rectangle of order 17 in which four squares meet at one inner
  // point (found by our foundry, in the published A002839 count for n = 17). By Brooks, Smith,
  // Stone & Tutte (1940) such a tiling has two c-nets: the segment through the cross taken as
  // one node or as two; both are 3-connected here and both solve to the same tiling.
  const crossed = '17 187 181 (102,85)(17,24,44)(79,23,10,7)(3,16,12)(13)(4,8)(56)(52)';

  it('finds the cross, and two 3-connected c-nets that both solve back to the tiling', () => {
    const t = parseTiling(crossed);
    expect(crossPoints(t)).toHaveLength(1);
    const nets = cNetsOf(t);
    expect(nets.length).toBe(2);
    const sizes = nets.map((g) => g.n).sort((a, b) => a - b);
    expect(sizes[1]! - sizes[0]!).toBe(1);
    for (const [i, split] of [[], crossPoints(t)].entries()) {
      const { graph, p, q } = cNetOf(t, split);
      expect(isThreeConnected(graph)).toBe(true);
      const r = solvePlaneNetwork(graph, { p, q });
      expect({ i, ok: r.ok }).toEqual({ i, ok: true });
      if (r.ok) expect(canonicalKey(r.tiling)).toBe(canonicalKey(t));
    }
  });

  it('a tiling without crosses has one c-net, its Smith diagram (the 33 x 32 of the reference facts)', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    expect(crossPoints(t)).toEqual([]);
    const nets = cNetsOf(t);
    expect(nets).toHaveLength(1);
    // facts.md: six segments (y = 0, 15, 18, 22, 23, 32), nine squares plus the pole edge
    expect(nets[0]!.n).toBe(6);
    expect(nets[0]!.adj.flat().length / 2).toBe(10);
  });
});
