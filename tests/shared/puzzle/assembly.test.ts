import { describe, expect, it } from 'vitest';
import { canonicalKey, mulberry32, parseTiling, verifyTiling } from '../../../shared/tiling/index';
import type { Tiling } from '../../../shared/tiling/index';
import { solveAssembly } from '../../../shared/puzzle/assembly';
import { PuzzleInputError } from '../../../shared/puzzle/errors';
import { catalogue } from './catalogue';
import { referenceAssemble } from './reference-solver';

const sizesOf = (t: Tiling) => t.squares.map((q) => q.s);
const classesOf = (ts: Tiling[]) => new Set(ts.map(canonicalKey));

// OEIS A014530; Duijvestijn, J. Combin. Theory B 25 (1978): the lowest-order simple perfect squared square
const SQUARE_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';
// OEIS A181340 (Willcocks 1948): the lowest-order compound perfect squared square
const COMPOUND_175 = '24 175 175 (81,56,38)(18,20)(55,16,3)(1,5,14)(4)(9)(39)(51,30)(29,31,64)(43,8)(35,2)(33)';
// engine.md 7: an order-13 pair of different simple perfect rectangles with the same elements
const TWIN_13 = '13 112 75 (33,24,19,36)(5,14)(9,20)(42)(11,3)(39)(31)';

describe('assembly: published facts', () => {
  it('the 21 sizes of the 112 square assemble in exactly one way (OEIS A014530)', () => {
    const t = parseTiling(SQUARE_112);
    const r = solveAssembly({ width: 112, height: 112, pieces: sizesOf(t) });
    expect(r.verdict).toBe('unique');
    expect(r.complete).toBe(true);
    expect(canonicalKey(r.solutions[0]!)).toBe(canonicalKey(t));
    // a perfect square has 8 images, all distinct placements
    expect(solveAssembly({ width: 112, height: 112, pieces: sizesOf(t) }, { mode: 'count' }).rawSolutions).toBe(8);
  });

  it('the squares 1..24 cannot fill 70 x 70 although 1^2+...+24^2 = 70^2 (MathWorld, "Perfect Square Dissection")', () => {
    const pieces = Array.from({ length: 24 }, (_, i) => i + 1);
    expect(pieces.reduce((a, s) => a + s * s, 0)).toBe(70 * 70);
    const r = solveAssembly({ width: 70, height: 70, pieces });
    expect(r.verdict).toBe('none');
    expect(r.complete).toBe(true);
  });

  it('the order-13 twin set has two classes; the solver finds the twin and both verify (engine.md 7)', () => {
    const t = parseTiling(TWIN_13);
    const r = solveAssembly({ width: 112, height: 75, pieces: sizesOf(t) }, { mode: 'count' });
    expect(r.verdict).toBe('multiple');
    expect(r.classes).toBe(2);
    expect(r.complete).toBe(true);
    const keys = r.solutions.map(canonicalKey);
    expect(keys).toContain(canonicalKey(t));
    for (const s of r.solutions) expect(verifyTiling(s)).toEqual({ ok: true });
    expect(r.second!.difference.first.length).toBeGreaterThan(0);
    expect(r.second!.difference.sizes.length).toBe(r.second!.difference.first.length);
  });

  it('the sizes of the compound 175 square are not unique (engine.md 7: a sub-rectangle can be turned in place)', () => {
    const t = parseTiling(COMPOUND_175);
    const r = solveAssembly({ width: 175, height: 175, pieces: sizesOf(t) });
    expect(r.verdict).toBe('multiple');
    expect(r.second).toBeDefined();
    expect(verifyTiling(r.second!.tiling)).toEqual({ ok: true });
  });
});

describe('assembly agrees with the plain reference solver', () => {
  for (const order of [9, 10, 11, 12]) {
    it(`on every catalogue set of order ${order} (squaring.net catalogue): raw counts and classes`, () => {
      for (const { code, tiling } of catalogue(order)) {
        const pieces = sizesOf(tiling);
        const ref = referenceAssemble(tiling.W, tiling.H, pieces);
        const fast = solveAssembly({ width: tiling.W, height: tiling.H, pieces }, { mode: 'count' });
        expect(fast.complete, code).toBe(true);
        expect(fast.rawSolutions, code).toBe(ref.length);
        expect(fast.classes, code).toBe(classesOf(ref).size);
        expect(fast.verdict, code).toBe(classesOf(ref).size === 1 ? 'unique' : 'multiple');
      }
    });
  }

  const imperfect: [string, number, number, number[]][] = [
    ['6x6 with five 2s and sixteen 1s', 6, 6, [2, 2, 2, 2, 2, ...Array<number>(16).fill(1)]],
    ['4x4 with four 2s', 4, 4, [2, 2, 2, 2]],
    ['5x3 with a 3 and six 1s', 5, 3, [3, 1, 1, 1, 1, 1, 1]],
    ['6x4 with 3, 3, 2, 2, 2', 6, 4, [3, 3, 2, 2, 2]],
    ['7x5 mixed', 7, 5, [3, 3, 2, 2, 2, 1, 1, 1, 1, 1]],
    ['5x5 with a 3, three 2s and four 1s', 5, 5, [3, 2, 2, 2, 1, 1, 1, 1]],
    ['2x2 in ones', 2, 2, [1, 1, 1, 1]],
  ];
  for (const [name, W, H, pieces] of imperfect) {
    it(`on the imperfect set ${name}`, () => {
      const ref = referenceAssemble(W, H, pieces);
      const fast = solveAssembly({ width: W, height: H, pieces }, { mode: 'count' });
      expect(fast.rawSolutions).toBe(ref.length);
      expect(fast.classes).toBe(classesOf(ref).size);
    });
  }

  it('on seeded random small sets (imperfect, often impossible): raw counts, classes and verdicts', () => {
    const rnd = mulberry32(2024);
    let none = 0;
    let some = 0;
    for (let t = 0; t < 40; t++) {
      const W = 3 + Math.floor(rnd() * 5);
      const H = 3 + Math.floor(rnd() * 4);
      const pieces: number[] = [];
      let area = W * H;
      while (area > 0) {
        const s = 1 + Math.floor(rnd() * Math.min(W, H, 4));
        if (s * s <= area) { pieces.push(s); area -= s * s; }
      }
      const ref = referenceAssemble(W, H, pieces);
      const fast = solveAssembly({ width: W, height: H, pieces }, { mode: 'count' });
      expect(fast.rawSolutions, `${W}x${H} ${pieces.join(',')}`).toBe(ref.length);
      expect(fast.classes).toBe(classesOf(ref).size);
      if (ref.length === 0) { none++; expect(fast.verdict).toBe('none'); } else some++;
    }
    expect(none).toBeGreaterThan(0);
    expect(some).toBeGreaterThan(0);
  });

  it('never counts permutations of equal sizes: four 1s fill 2 x 2 in exactly one placement', () => {
    const r = solveAssembly({ width: 2, height: 2, pieces: [1, 1, 1, 1] }, { mode: 'count' });
    expect(r.rawSolutions).toBe(1);
    expect(r.verdict).toBe('unique');
  });

  it('works in a frame taller than wide: the 33 x 32 set in 32 x 33 (squaring.net)', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const ref = referenceAssemble(32, 33, sizesOf(t));
    const fast = solveAssembly({ width: 32, height: 33, pieces: sizesOf(t) }, { mode: 'count' });
    expect(fast.verdict).toBe('unique');
    expect(fast.rawSolutions).toBe(ref.length);
    expect(fast.rawSolutions).toBe(4); // a perfect rectangle has 4 distinct images in its own frame
    expect(canonicalKey(fast.solutions[0]!)).toBe(canonicalKey(t));
  });

  it('6x6 with five 2s and sixteen 1s: 273 classes, 1974 raw (measured by our prototype, engine.md 7.1)', () => {
    const r = solveAssembly({ width: 6, height: 6, pieces: [2, 2, 2, 2, 2, ...Array<number>(16).fill(1)] }, { mode: 'count' });
    expect(r.classes).toBe(273);
    expect(r.rawSolutions).toBe(1974);
  });

  it('a compound set built from two catalogue rectangles is not unique, as the reference solver also finds', () => {
    // the 33 x 32 rectangle (squaring.net) stacked on a 33 x 33 square: a trivially compound 33 x 65 set
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const pieces = [...sizesOf(t), 33];
    const ref = referenceAssemble(33, 65, pieces);
    const fast = solveAssembly({ width: 33, height: 65, pieces }, { mode: 'count' });
    expect(fast.verdict).toBe('multiple');
    expect(fast.classes).toBe(classesOf(ref).size);
    expect(fast.rawSolutions).toBe(ref.length);
  });
});

describe('assembly: starters, quick refusals, budgets and input errors', () => {
  it('a starter piece from the intended tiling settles the twin set', () => {
    const t = parseTiling(TWIN_13);
    const pieces = sizesOf(t);
    const both = solveAssembly({ width: 112, height: 75, pieces }, { mode: 'count' });
    const [a, b] = both.solutions as [Tiling, Tiling];
    // a square of the first solution that is not in the same place in the second
    const moved = both.second!.difference.first[0]!;
    const q = a.squares[moved]!;
    const r = solveAssembly({ width: 112, height: 75, pieces, starters: [{ size: q.s, x: q.x, y: q.y }] }, { mode: 'count' });
    expect(r.verdict).toBe('unique');
    expect(canonicalKey(r.solutions[0]!)).toBe(canonicalKey(a));
    expect(canonicalKey(b)).not.toBe(canonicalKey(a));
  });

  it('starters agree with filtering the reference solutions by the starter', () => {
    const pieces = [2, 2, 2, 2, 2, ...Array<number>(16).fill(1)];
    const starter = { size: 2, x: 2, y: 2 };
    const ref = referenceAssemble(6, 6, pieces).filter((t) => t.squares.some((q) => q.s === 2 && q.x === 2 && q.y === 2));
    const r = solveAssembly({ width: 6, height: 6, pieces, starters: [starter] }, { mode: 'count' });
    expect(r.rawSolutions).toBe(ref.length);
    expect(r.classes).toBe(classesOf(ref).size);
  });

  it('refuses at once when the areas do not add up, or a piece is larger than the frame', () => {
    const a = solveAssembly({ width: 5, height: 5, pieces: [3, 2] });
    expect(a.verdict).toBe('none');
    expect(a.reason).toMatch(/areas do not add up/);
    expect(a.nodes).toBe(0);
    const b = solveAssembly({ width: 8, height: 2, pieces: [4] });
    expect(b.verdict).toBe('none');
    expect(b.reason).toMatch(/larger than the 8x2 frame/);
    expect(b.nodes).toBe(0);
  });

  it('says undecided, honestly, when the node budget runs out', () => {
    const pieces = Array.from({ length: 24 }, (_, i) => i + 1);
    const r = solveAssembly({ width: 70, height: 70, pieces }, { budget: { maxNodes: 500 } });
    expect(r.verdict).toBe('undecided');
    expect(r.complete).toBe(false);
    expect(r.stoppedBy).toBe('max-nodes');
    expect(r.reason).toMatch(/not proved/);
  });

  it('can be cancelled and reports progress', () => {
    const pieces = Array.from({ length: 24 }, (_, i) => i + 1);
    const seen: number[] = [];
    let calls = 0;
    const r = solveAssembly({ width: 70, height: 70, pieces }, { shouldStop: () => ++calls > 20, onProgress: (n) => seen.push(n) });
    expect(r.verdict).toBe('undecided');
    expect(r.stoppedBy).toBe('cancelled');
    expect(seen.length).toBeGreaterThan(0);
    expect(seen[seen.length - 1]).toBe(r.nodes);
  });

  it('answers in plain JSON (a JSON round trip changes nothing)', () => {
    const t = parseTiling(TWIN_13);
    const r = solveAssembly({ width: 112, height: 75, pieces: sizesOf(t) });
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });

  it('names the bad field in input errors', () => {
    const bad = (input: unknown) => {
      try { solveAssembly(input as never); } catch (e) { return e; }
      return null;
    };
    const e1 = bad({ width: 0, height: 3, pieces: [1] }) as PuzzleInputError;
    expect(e1).toBeInstanceOf(PuzzleInputError);
    expect(e1.where?.field).toBe('width');
    const e2 = bad({ width: 3, height: 3, pieces: [1, 2.5] }) as PuzzleInputError;
    expect(e2.where).toEqual({ field: 'pieces', index: 1 });
    const e3 = bad({ width: 3, height: 3, pieces: [3], starters: [{ size: 2, x: 0, y: 0 }] }) as PuzzleInputError;
    expect(e3.code).toBe('bad-starter');
    expect(e3.message).toMatch(/not among the pieces/);
    const e5 = bad({ width: 2_000_000, height: 3, pieces: [1] }) as PuzzleInputError;
    expect(e5.message).toMatch(/limited to 1000000/);
    const e4 = bad({ width: 3, height: 3, pieces: [2, 2], starters: [{ size: 2, x: 0, y: 0 }, { size: 2, x: 1, y: 1 }] }) as PuzzleInputError;
    expect(e4.message).toMatch(/overlap/);
  });
});
