import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { edgesOf, mulberry32, orientations, parseTiling, randomCNet, solvePlaneNetwork, toBouwkamp, toTableCode, type Tiling } from '../../../shared/tiling/index';
import { acceptCode, tilingFacts } from '../../../shared/tiling/tiling-facts';
import { core } from '../../../shared/tiling/tiling-core';
import { bruteForceSubRectangles, referenceCanonical, referenceClassification } from './reference';
import { O21_112, O24_175, O9_33x32, greedyTiling, stackedTiling } from './helpers';

// acceptCode's fast path (skyline decode; simplicity from the group and chain candidates;
// orientation reading orders from the segments without sorting the squares; the canonical code
// written digit by digit) against the straightforward path: parseTiling, the classification
// from segments by sorting and the canonical form from all orientations compared.

function solved(seed: number, count: number, minEdges: number, maxEdges: number): Tiling[] {
  const rng = mulberry32(seed);
  const out: Tiling[] = [];
  while (out.length < count) {
    const g = randomCNet(minEdges + Math.floor(rng() * (maxEdges - minEdges + 1)), rng);
    const es = edgesOf(g);
    const [p, q] = es[Math.floor(rng() * es.length)]!;
    const r = solvePlaneNetwork(g, { p, q });
    if (r.ok) out.push(r.tiling);
  }
  return out;
}

const sorted = (rs: { x: number; y: number; w: number; h: number }[]) => rs.map((r) => `${r.x},${r.y},${r.w},${r.h}`).sort();

function straightforward(code: string) {
  const t = parseTiling(code);
  const c = referenceCanonical(t);
  return { tiling: t, classification: referenceClassification(t), code: c.code, key: c.key, canonicalTiling: c.tiling };
}

function check(t: Tiling): void {
  for (const o of orientations(t, { all: true })) {
    for (const code of [toBouwkamp(o), toTableCode(o)]) {
      const fast = acceptCode(code, true);
      const ref = straightforward(code);
      expect({ ...fast, classification: { ...fast.classification, subRectangles: sorted(fast.classification.subRectangles) } }).toEqual({
        ...ref,
        classification: { ...ref.classification, subRectangles: sorted(ref.classification.subRectangles), subRectanglesTruncated: false },
      });
      expect(tilingFacts(o).code).toBe(ref.code);
    }
    // the simplicity test on its own (classify lists sub-rectangles only when it says compound)
    expect(core.load(o)).toBe(true);
    expect(core.isSimple()).toBe(bruteForceSubRectangles(o).length === 0);
  }
}

describe('acceptCode = the straightforward path', () => {
  it('on simple tilings from seeded random c-nets, orders 7 to 45, in all eight orientations', () => {
    for (const t of solved(31, 80, 8, 46)) check(t);
  });

  it('on imperfect and compound tilings (greedy fills with crosses, stacks), in all orientations (fast-check, seeded)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 16 }), fc.integer({ min: 1, max: 16 }), fc.array(fc.integer({ min: 1, max: 8 }), { minLength: 30, maxLength: 30 }), (W, H, picks) => {
        check(greedyTiling(W, H, picks));
      }),
      { seed: 77, numRuns: 300 },
    );
    for (const code of [O9_33x32, O21_112, O24_175]) {
      check(parseTiling(code));
      check(stackedTiling(parseTiling(code), 2));
    }
  });

  it('writes large sizes digit by digit exactly (sides up to 2^31)', () => {
    // sixteen squares of 2^27 in a row: width 2^31 (the widest accepted side)
    const row: Tiling = { W: 2 ** 31, H: 2 ** 27, squares: Array.from({ length: 16 }, (_, i) => ({ x: i * 2 ** 27, y: 0, s: 2 ** 27 })) };
    const f = tilingFacts(row);
    expect(f.code).toBe(`16 2147483648 134217728 (${Array.from({ length: 16 }, () => '134217728').join(',')})`);
    expect(f.key).toBe(`2147483648x134217728:${Array.from({ length: 16 }, () => '134217728').join(',')}`);
    expect(acceptCode(f.code).code).toBe(f.code);
    // a perfect tiling scaled to sides just below 2^31 (nine- and ten-digit sizes)
    const k = Math.floor(2 ** 31 / 112);
    const t = parseTiling(O21_112);
    const big: Tiling = { W: t.W * k, H: t.H * k, squares: t.squares.map((q) => ({ x: q.x * k, y: q.y * k, s: q.s * k })) };
    const code = toBouwkamp(big);
    const fast = acceptCode(code);
    const ref = straightforward(code);
    expect([fast.tiling, fast.code, fast.key]).toEqual([ref.tiling, ref.code, ref.key]);
    expect({ ...fast.classification, subRectangles: sorted(fast.classification.subRectangles) }).toEqual({
      ...ref.classification,
      subRectangles: sorted(ref.classification.subRectangles),
      subRectanglesTruncated: false,
    });
  });
});
