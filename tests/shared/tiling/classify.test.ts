import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { classifyTiling, isSimple, parseTiling, reduceTiling, subRectangles, toBouwkamp, type Tiling } from '../../../shared/tiling/index';
import { O21_112, O24_175, O9_33x32, catalogue, greedyTiling } from './helpers';

// a brute-force reference: every (x1, y1, x2, y2) rectangle over all square-corner
// coordinates, checked cell by cell (independent of the segment-based O(n^2) test)
function bruteSubRectangles(t: Tiling): string[] {
  const xs = [...new Set(t.squares.flatMap((q) => [q.x, q.x + q.s]))].sort((a, b) => a - b);
  const ys = [...new Set(t.squares.flatMap((q) => [q.y, q.y + q.s]))].sort((a, b) => a - b);
  const out: string[] = [];
  for (const x1 of xs) for (const x2 of xs) for (const y1 of ys) for (const y2 of ys) {
    if (x2 <= x1 || y2 <= y1 || (x1 === 0 && y1 === 0 && x2 === t.W && y2 === t.H)) continue;
    let inside = 0;
    let ok = true;
    for (const q of t.squares) {
      const disjoint = q.x >= x2 || q.x + q.s <= x1 || q.y >= y2 || q.y + q.s <= y1;
      const within = q.x >= x1 && q.x + q.s <= x2 && q.y >= y1 && q.y + q.s <= y2;
      if (within) inside++;
      else if (!disjoint) ok = false;
    }
    if (ok && inside >= 2) out.push(`${x1},${y1},${x2 - x1},${y2 - y1}`);
  }
  return out.sort();
}

describe('classifyTiling', () => {
  it('every catalogue tiling of orders 9-13 is simple and perfect, not a square (squaring.net catalogue; A002839 counts rectangles)', () => {
    for (const { order, code } of catalogue()) {
      const c = classifyTiling(parseTiling(code));
      expect(c.order).toBe(order);
      expect(c.simple, code).toBe(true);
      expect(c.perfect, code).toBe(true);
      expect(c.trivialCompound).toBe(false);
      expect(c.subRectangles).toEqual([]);
    }
  });

  it('the 112 square is a simple perfect squared square with sizes 2..50 (OEIS A014530)', () => {
    const c = classifyTiling(parseTiling(O21_112));
    expect(c).toMatchObject({ order: 21, width: 112, height: 112, square: true, perfect: true, simple: true, gcd: 1, minSize: 2, maxSize: 50 });
  });

  it('the 175 square is compound with its 94 x 111 block of 13 squares (OEIS A181340, Willcocks 1948)', () => {
    const t = parseTiling(O24_175);
    const c = classifyTiling(t);
    expect(c.simple).toBe(false);
    expect(c.perfect).toBe(true);
    const block = c.subRectangles.find((r) => r.w === 94 && r.h === 111);
    expect(block).toBeDefined();
    const inside = t.squares.filter((q) => q.x >= block!.x && q.x + q.s <= block!.x + 94 && q.y >= block!.y && q.y + q.s <= block!.y + 111);
    expect(inside.length).toBe(13);
    // the block itself is a simple perfect rectangle (reference facts)
    const sub: Tiling = { W: 94, H: 111, squares: inside.map((q) => ({ x: q.x - block!.x, y: q.y - block!.y, s: q.s })) };
    expect(isSimple(sub)).toBe(true);
  });

  it('a square spanning the full height makes a tiling trivially compound', () => {
    const t = parseTiling('(3,2)(1,1)'); // 5 x 3: a 3 beside a 2 over two 1s
    const c = classifyTiling(t);
    expect(c.trivialCompound).toBe(true);
    expect(c.simple).toBe(false);
    expect(c.perfect).toBe(false);
    expect(c.minSize).toBe(1);
  });

  it('a cross (four unit squares meeting at a point) is legal and compound', () => {
    const t = parseTiling('(1,1)(1,1)');
    expect(classifyTiling(t).subRectangles.length).toBe(4); // two 2x1 and two 1x2 halves
  });

  it('the gcd is reported for an unreduced tiling, and reduceTiling divides it out', () => {
    // the 33 x 32 doubled (reference facts: the c-net gives it unreduced as 66 x 64 with k = 2)
    const doubled = parseTiling('(36,30)(14,16)(28,8)(20,2)(18)');
    expect(classifyTiling(doubled).gcd).toBe(2);
    expect(toBouwkamp(reduceTiling(doubled))).toBe(O9_33x32);
    expect(reduceTiling(parseTiling(O9_33x32))).toEqual(parseTiling(O9_33x32));
  });

  it('agrees with a brute-force sub-rectangle search on random tilings of small grids (fast-check, seeded)', () => {
    // random guillotine-free tilings: fill a small rectangle greedily with random sizes
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 9 }), fc.integer({ min: 2, max: 9 }), fc.array(fc.integer({ min: 1, max: 5 }), { minLength: 100, maxLength: 100 }), (W, H, picks) => {
        const t = greedyTiling(W, H, picks);
        const fast = subRectangles(t, 100000).rects.map((r) => `${r.x},${r.y},${r.w},${r.h}`).sort();
        expect(fast).toEqual(bruteSubRectangles(t));
        expect(isSimple(t)).toBe(fast.length === 0);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('the 33 x 32 has no sub-rectangle', () => {
    expect(subRectangles(parseTiling(O9_33x32))).toEqual({ rects: [], truncated: false });
  });

  it('lists at most the limit and says it truncated', () => {
    const grid = parseTiling(`(${Array.from({ length: 10 }, () => '1').join(',')})${'(1,1,1,1,1,1,1,1,1,1)'.repeat(9)}`);
    const r = subRectangles(grid, 50);
    expect(r.rects.length).toBe(50);
    expect(r.truncated).toBe(true);
    expect(classifyTiling(grid).subRectanglesTruncated).toBe(true);
  });
});
