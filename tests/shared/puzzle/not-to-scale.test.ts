import { describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import type { Tiling } from '../../../shared/tiling/index';
import { notToScaleLayout, notToScaleRects, sameSmithDiagram } from '../../../shared/puzzle/not-to-scale';
import { catalogue } from './catalogue';

// OEIS A014530; Duijvestijn 1978
const SQUARE_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';

describe('not-to-scale layout', () => {
  it('keeps the Smith diagram of every catalogue rectangle of orders 9 to 12 and of the 112 square', () => {
    const tilings = [9, 10, 11, 12].flatMap((o) => catalogue(o).map((c) => c.tiling)).concat([parseTiling(SQUARE_112)]);
    for (const t of tilings) {
      const d = notToScaleLayout(t);
      expect(sameSmithDiagram(t, d)).toEqual({ same: true });
    }
  });

  it('keeps the order of every coordinate and puts the grid lines evenly', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const d = notToScaleLayout(t, { width: 100, height: 100 });
    for (let i = 0; i < t.squares.length; i++) for (let j = 0; j < t.squares.length; j++) {
      const a = t.squares[i]!;
      const b = t.squares[j]!;
      expect(Math.sign(d.rects[i]!.x - d.rects[j]!.x)).toBe(Math.sign(a.x - b.x));
      expect(Math.sign(d.rects[i]!.y - d.rects[j]!.y)).toBe(Math.sign(a.y - b.y));
    }
    const xs = [...new Set(d.rects.flatMap((r) => [r.x, r.x + r.w]))].sort((a, b) => a - b);
    const gaps = xs.slice(1).map((x, j) => x - xs[j]!);
    for (const g of gaps) expect(g).toBeCloseTo(gaps[0]!, 9);
  });

  it('hides the sizes: the two largest squares of the 33 x 32 are drawn the same width', () => {
    // drawn widths count grid steps, so different sizes share a width
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const d = notToScaleLayout(t);
    const widths = d.rects.map((r) => r.w);
    expect(new Set(widths).size).toBeLessThan(new Set(t.squares.map((q) => q.s)).size);
  });

  it('keeps a cross as a cross', () => {
    const t: Tiling = { W: 3, H: 3, squares: [
      { x: 0, y: 0, s: 2 }, { x: 2, y: 0, s: 1 }, { x: 2, y: 1, s: 1 }, { x: 0, y: 2, s: 1 }, { x: 1, y: 2, s: 1 }, { x: 2, y: 2, s: 1 },
    ] };
    expect(sameSmithDiagram(t, notToScaleLayout(t))).toEqual({ same: true });
  });

  it('rejects a drawing that moves a line past another', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const d = notToScaleLayout(t, { width: 50, height: 60 });
    // swap the order of two vertical lines by hand: make square C (index 2) wider, D narrower
    const bad = { ...d, rects: d.rects.map((r, i) => (i === 2 ? { ...r, w: r.w + 5 } : i === 3 ? { ...r, x: r.x + 5, w: r.w - 5 } : r)) };
    const res = sameSmithDiagram(t, bad);
    expect(res.same).toBe(false);
    const overlap = { ...d, rects: d.rects.map((r, i) => (i === 0 ? { ...r, w: r.w + 1 } : r)) };
    expect(sameSmithDiagram(t, overlap).same).toBe(false);
  });

  it("gives print's shape { W, H, rects }: the 33 x 32 on a grid of 4 units per step, worked by hand", () => {
    // Moron's 33 x 32 (squaring.net catalogue): distinct x 0, 14, 18, 24, 25, 33 and distinct
    // y 0, 15, 18, 22, 23, 32, so rank j goes to 4j and the box is 20 x 20.
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const r = notToScaleRects(t, { step: 4 });
    expect(r).toEqual({
      W: 20,
      H: 20,
      rects: [
        { x: 0, y: 0, w: 8, h: 8 }, { x: 8, y: 0, w: 12, h: 4 }, { x: 8, y: 4, w: 8, h: 8 },
        { x: 16, y: 4, w: 4, h: 12 }, { x: 0, y: 8, w: 4, h: 12 }, { x: 4, y: 8, w: 4, h: 4 },
        { x: 4, y: 12, w: 8, h: 8 }, { x: 12, y: 12, w: 4, h: 4 }, { x: 12, y: 16, w: 8, h: 4 },
      ],
    });
    expect(sameSmithDiagram(t, { width: r.W, height: r.H, rects: r.rects })).toEqual({ same: true });
    // the default grid is 10 units per step; an explicit box wins over the step
    expect(notToScaleRects(t)).toMatchObject({ W: 50, H: 50 });
    expect(notToScaleRects(t, { width: 66, height: 64, step: 4 })).toMatchObject({ W: 66, H: 64 });
  });
});
